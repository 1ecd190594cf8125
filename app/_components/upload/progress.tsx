/** A labelled progress bar; `value` null = the browser cannot tell how far it is. */
export function ProgressBar({
  id,
  label,
  value,
  detail,
}: {
  id: string;
  label: string;
  value: number | null;
  detail?: string;
}) {
  const pct = value === null ? null : Math.max(0, Math.min(100, Math.round(value * 100)));
  return (
    <div className="mb-3">
      <div className="mb-1 flex flex-wrap justify-between gap-x-3 text-sm sm:text-base">
        <span id={`${id}-label`} className="font-medium">
          {label}
        </span>
        <span className="font-medium tabular-nums text-ink" aria-hidden="true">
          {pct === null ? "…" : `${pct} %`}
          {detail ? ` · ${detail}` : ""}
        </span>
      </div>
      <div
        role="progressbar"
        aria-labelledby={`${id}-label`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct ?? undefined}
        aria-valuetext={pct === null ? `${label}: working` : `${label}: ${pct} %${detail ? `, ${detail}` : ""}`}
        data-testid={id}
        className="h-4 overflow-hidden rounded-plot border border-ink-faint bg-chalk-deep"
      >
        <div
          className={`h-full bg-leaf transition-[width] duration-150 ${pct === null ? "w-1/3 animate-pulse" : ""}`}
          style={pct === null ? undefined : { width: `${pct}%` }}
        />
      </div>
    </div>
  );
}
