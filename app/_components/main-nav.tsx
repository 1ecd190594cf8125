"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useRef, useState } from "react";

export interface NavItem {
  href: string;
  label: string;
}

/**
 * The main navigation and the account controls. From 768 px up they sit in the header row; below, a Menu button
 * opens them as a list of full-width links (Escape closes it and puts focus back on the button).
 */
export function MainNav({ items, account }: { items: NavItem[]; account: React.ReactNode }) {
  const [open, setOpen] = useState(false);
  const button = useRef<HTMLButtonElement>(null);
  const pathname = usePathname();

  // A link followed: the menu closes on the new page.
  // biome-ignore lint/correctness/useExhaustiveDependencies: closing is the point of watching the path
  useEffect(() => setOpen(false), [pathname]);

  // Escape closes the open menu and puts focus back on the button that opened it.
  useEffect(() => {
    if (!open) return;
    const onKey = (e: KeyboardEvent) => {
      if (e.key !== "Escape") return;
      setOpen(false);
      button.current?.focus();
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [open]);

  return (
    <>
      <button
        ref={button}
        type="button"
        className="ml-auto inline-flex min-h-11 min-w-11 items-center gap-2 rounded-plot border border-ink-faint px-3 text-sm font-medium md:hidden"
        aria-expanded={open}
        aria-controls="main-menu"
        data-testid="menu-button"
        onClick={() => setOpen((o) => !o)}
      >
        <svg aria-hidden="true" viewBox="0 0 16 16" className="h-4 w-4">
          {open ? (
            <path d="M3 3l10 10M13 3L3 13" stroke="currentColor" strokeWidth="1.75" />
          ) : (
            <path d="M2 4h12M2 8h12M2 12h12" stroke="currentColor" strokeWidth="1.75" />
          )}
        </svg>
        Menu
      </button>
      <div
        id="main-menu"
        className={`${open ? "flex" : "hidden"} w-full flex-col gap-3 md:flex md:w-auto md:flex-1 md:flex-row md:flex-wrap md:items-center md:gap-x-8`}
      >
        <nav aria-label="Main" className="text-sm font-medium">
          <ul className="flex flex-col md:flex-row md:flex-wrap md:gap-x-1">
            {items.map((n) => {
              const current = n.href === "/" ? pathname === "/" : pathname.startsWith(n.href);
              return (
                <li key={n.href}>
                  <Link
                    href={n.href}
                    aria-current={current ? "page" : undefined}
                    className={`flex min-h-11 items-center rounded-plot px-2 hover:bg-chalk-deep hover:text-ink md:min-h-9 ${
                      current ? "text-ink underline decoration-2 underline-offset-4" : "text-ink-soft"
                    }`}
                  >
                    {n.label}
                  </Link>
                </li>
              );
            })}
          </ul>
        </nav>
        <div className="flex flex-wrap items-center gap-3 border-t border-chalk-line pt-3 text-sm md:ml-auto md:border-0 md:pt-0">
          {account}
        </div>
      </div>
    </>
  );
}
