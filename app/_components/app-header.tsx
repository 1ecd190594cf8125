import Link from "next/link";
import { Wordmark } from "./mark";
import { SignOutButton } from "./sign-out-button";
import { MainNav } from "./main-nav";
import { ContrastToggle } from "./contrast-toggle";
import {
  ANY_ROLE,
  CAN_MANAGE_KEYS,
  CAN_MANAGE_TEAM,
  CAN_READ_OUTBOX,
  CAN_REVIEW,
  ROLE_LABEL,
  type Role,
} from "@/lib/roles";
import type { Viewer } from "@/lib/server/access";

// Each link is shown to the roles its page admits (the page checks the same list).
const NAV: { href: string; label: string; roles: readonly Role[] }[] = [
  { href: "/", label: "Home", roles: ANY_ROLE },
  { href: "/fields", label: "Fields", roles: ANY_ROLE },
  { href: "/profiles", label: "Tolerance profiles", roles: ANY_ROLE },
  { href: "/review", label: "Review", roles: CAN_REVIEW },
  { href: "/activity", label: "Activity", roles: ANY_ROLE },
  // Machines and alerts (issue 13)
  { href: "/machines", label: "Machines", roles: ANY_ROLE },
  { href: "/alerts", label: "Alerts", roles: ANY_ROLE },
  { href: "/team", label: "Team", roles: CAN_MANAGE_TEAM },
  { href: "/settings/keys", label: "API keys", roles: CAN_MANAGE_KEYS },
  { href: "/outbox", label: "Outbox", roles: CAN_READ_OUTBOX },
];

/** Jumps past the header to the page's own content; shown when it takes keyboard focus. */
export function SkipLink() {
  return (
    <a
      href="#main"
      className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded-plot focus:bg-white focus:px-4 focus:py-3 focus:font-medium focus:text-ink"
    >
      Skip to the page’s content
    </a>
  );
}

export function AppHeader({ viewer }: { viewer: Viewer }) {
  const items = NAV.filter((n) => n.roles.includes(viewer.role)).map(({ href, label }) => ({ href, label }));
  return (
    <header className="border-b border-chalk-line bg-white">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-8 gap-y-2 px-4 py-2 sm:px-6">
        <Link href="/" aria-label="Plotproof home" className="inline-flex min-h-11 items-center">
          <Wordmark />
        </Link>
        <MainNav
          items={items}
          account={
            <>
              <span className="text-ink-soft" data-testid="viewer">
                {viewer.name} · <span className="font-medium text-ink">{ROLE_LABEL[viewer.role]}</span> ·{" "}
                {viewer.orgName}
              </span>
              <ContrastToggle />
              <SignOutButton />
            </>
          }
        />
      </div>
    </header>
  );
}
