import Link from "next/link";

export function PageTitle({ children, sub }: { children: React.ReactNode; sub?: React.ReactNode }) {
  return (
    <header className="mb-6">
      <h1 className="text-xl font-semibold tracking-tight">{children}</h1>
      {sub ? <p className="mt-1 text-sm text-ink-soft">{sub}</p> : null}
    </header>
  );
}

export function Panel({
  title,
  children,
  action,
}: {
  title: string;
  children: React.ReactNode;
  action?: React.ReactNode;
}) {
  return (
    <section className="rounded-plot border border-chalk-line bg-white p-5" aria-label={title}>
      <div className="mb-3 flex items-baseline justify-between gap-4">
        <h2 className="text-base font-semibold">{title}</h2>
        {action}
      </div>
      {children}
    </section>
  );
}

export function Empty({ children }: { children: React.ReactNode }) {
  return <p className="text-sm text-ink-faint">{children}</p>;
}

export function TextLink({ href, children }: { href: string; children: React.ReactNode }) {
  return (
    <Link href={href} className="font-medium text-leaf underline-offset-2 hover:underline">
      {children}
    </Link>
  );
}

/** The standing caution for anyone working beside autonomous machinery. */
export function FieldSafetyNote() {
  return (
    <aside className="rounded-plot border-l-4 border-stake bg-stake-pale p-4 text-sm" aria-label="Safety in the field">
      <p className="font-semibold">Before you survey beside a planting or hoeing machine</p>
      <ul className="mt-1 list-disc pl-5 text-ink-soft">
        <li>
          Make sure the machine is stopped, its autonomous mode is switched off and it cannot restart while you are in
          the beds; follow the operator&apos;s lock-out procedure.
        </li>
        <li>Keep clear of tool arms, blades and tines, even when still.</li>
        <li>Wear high-visibility clothing near farm tracks and public roads.</li>
        <li>Plotproof checks record accuracy only. Boundary and legal surveys follow local licensed practice.</li>
      </ul>
    </aside>
  );
}

export function formatMm(metres: number | null | undefined): string {
  if (metres === null || metres === undefined || !Number.isFinite(metres)) return "–";
  return `${(metres * 1000).toFixed(1)} mm`;
}

const countFormat = new Intl.NumberFormat("en-GB");
/** A count with thousands separators, e.g. "4,640". */
export function formatCount(n: number): string {
  return countFormat.format(n);
}

export function formatDate(iso: string): string {
  return new Date(iso).toLocaleString("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone: "UTC" }) + " UTC";
}

/** A time in an IANA time zone with the zone's short name, e.g. "14 Apr 2026, 23:40 CEST". */
export function formatInZone(iso: string, timeZone: string): string {
  return new Date(iso).toLocaleString("en-GB", {
    day: "numeric",
    month: "short",
    year: "numeric",
    hour: "2-digit",
    minute: "2-digit",
    timeZone,
    timeZoneName: "short",
  });
}

/** A time shown in the field's time zone; the same instant in UTC on hover. */
export function FieldTime({ iso, timeZone }: { iso: string; timeZone: string }) {
  return (
    <time dateTime={iso} title={formatDate(iso)} data-testid="field-time">
      {formatInZone(iso, timeZone)}
    </time>
  );
}

/** "revision 2" after a title when the audit is a corrected revision; nothing for the first. */
export function RevisionTag({ revision }: { revision: number }) {
  return revision > 1 ? (
    <span className="ml-1 rounded-plot border border-chalk-line px-1 text-xs text-ink-soft" data-testid="revision-tag">
      revision {revision}
    </span>
  ) : null;
}

/**
 * A wide table scrolls inside its own box on a narrow screen instead of widening the page. The box takes keyboard
 * focus (arrow keys scroll it) and is named for screen readers.
 */
export function TableScroll({ label, children }: { label: string; children: React.ReactNode }) {
  return (
    // biome-ignore lint/a11y/noNoninteractiveTabindex: a scrolling region must be reachable by keyboard (WCAG 2.1.1)
    <div className="relative max-w-full overflow-x-auto" role="region" aria-label={label} tabIndex={0}>
      {children}
    </div>
  );
}
