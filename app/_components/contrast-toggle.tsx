"use client";
import { useEffect, useState } from "react";
import { HIGH_CONTRAST_CLASS, HIGH_CONTRAST_STORAGE_KEY } from "@/lib/a11y/palette";

/** A switch for bright sunlight: darker greys, white surfaces, dark rules, a thicker focus ring. Remembered per browser. */
export function ContrastToggle() {
  const [on, setOn] = useState(false);
  useEffect(() => setOn(document.documentElement.classList.contains(HIGH_CONTRAST_CLASS)), []);
  return (
    <button
      type="button"
      aria-pressed={on}
      data-testid="contrast-toggle"
      className="inline-flex min-h-11 items-center gap-2 rounded-plot border border-ink-faint px-3 text-sm font-medium text-ink hover:bg-chalk-deep"
      onClick={() => {
        const next = !on;
        setOn(next);
        document.documentElement.classList.toggle(HIGH_CONTRAST_CLASS, next);
        try {
          if (next) localStorage.setItem(HIGH_CONTRAST_STORAGE_KEY, "1");
          else localStorage.removeItem(HIGH_CONTRAST_STORAGE_KEY);
        } catch {
          // Storage refused (private mode): the choice lasts for this page only.
        }
      }}
    >
      <svg aria-hidden="true" viewBox="0 0 16 16" className="h-4 w-4">
        <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="1.5" />
        <path d="M8 1.5a6.5 6.5 0 0 1 0 13z" fill="currentColor" />
      </svg>
      High contrast
    </button>
  );
}
