import type { AuditDto } from "@/lib/api-types";

const STAGE: Record<string, string> = {
  queued: "Waiting to start",
  loading: "Loading the stored points",
  computing: "Starting the computation",
  pairing: "Projecting and pairing checkpoints with records",
  statistics: "Computing the accuracy figures",
  saving: "Saving the per-plant errors",
  done: "Finishing",
};

/** Progress of an audit that is still being computed. */
export function AuditProgress({ audit }: { audit: AuditDto }) {
  const pct = Math.max(0, Math.min(100, Math.round((audit.progress ?? 0) * 100)));
  const stage = audit.progressStage ? (STAGE[audit.progressStage] ?? audit.progressStage) : "Starting";
  return (
    <section
      className="rounded-plot border border-chalk-line bg-white p-5"
      aria-labelledby="progress-heading"
      data-testid="audit-progress"
    >
      <h2 id="progress-heading" className="text-base font-semibold">
        Computing the audit
      </h2>
      <p className="mt-1 text-sm text-ink-soft" aria-live="polite">
        {stage} · {pct} %
      </p>
      <div
        className="mt-3 h-3 w-full overflow-hidden rounded-plot bg-chalk-deep"
        role="progressbar"
        aria-label="Audit progress"
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={pct}
        aria-valuetext={`${stage}, ${pct} %`}
      >
        <div className="h-full bg-leaf transition-[width] duration-500" style={{ width: `${pct}%` }} />
      </div>
      <p className="mt-3 text-xs text-ink-faint">
        You can leave this page; the audit keeps running and its result will be here.
      </p>
    </section>
  );
}
