import Link from "next/link";
import { Wordmark } from "./mark";
import { SignOutButton } from "./sign-out-button";
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

export function AppHeader({ viewer }: { viewer: Viewer }) {
  return (
    <header className="border-b border-chalk-line bg-white">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-8 gap-y-2 px-6 py-3">
        <Link href="/" aria-label="Plotproof home">
          <Wordmark />
        </Link>
        <nav aria-label="Main" className="flex gap-5 text-sm font-medium">
          {NAV.filter((n) => n.roles.includes(viewer.role)).map((n) => (
            <Link key={n.href} href={n.href} className="text-ink-soft hover:text-ink">
              {n.label}
            </Link>
          ))}
        </nav>
        <div className="ml-auto flex items-center gap-4 text-sm">
          <span className="text-ink-soft" data-testid="viewer">
            {viewer.name} · <span className="font-medium text-ink">{ROLE_LABEL[viewer.role]}</span> · {viewer.orgName}
          </span>
          <SignOutButton />
        </div>
      </div>
    </header>
  );
}
