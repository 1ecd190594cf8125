import type { ControlMarkDto, PlanPointDto, SurveyPlanDto } from "@/lib/plan/dto";
import { STANDARD_LABEL } from "@/lib/plan/sample-size";
import { STRATUM_LABEL } from "@/lib/plan/select";
import { TableScroll } from "@/app/_components/ui";

/** The caution for anyone walking the beds with a stakeout list. */
export function PlanSafetyNote() {
  return (
    <aside
      className="rounded-plot border-l-4 border-stake bg-stake-pale p-4 text-sm print:border print:bg-white"
      aria-label="Safety in the field"
      data-testid="plan-safety"
    >
      <p className="font-semibold">Safety before entering the beds</p>
      <ul className="mt-1 list-disc pl-5">
        <li>Stop the machine and lock it out (autonomous mode off, key removed) before anyone enters the beds.</li>
        <li>Keep clear of tool arms, blades and tines, even when the machine is stopped.</li>
        <li>Wear high-visibility clothing near farm tracks and roads; watch for other vehicles.</li>
        <li>Local rules, the farm&apos;s own procedures and licensed survey practice come first.</li>
      </ul>
    </aside>
  );
}

/** How many checkpoints, and why: the share test, the standards' minimums and the profile's minimum. */
export function SampleSizeText({ plan }: { plan: SurveyPlanDto }) {
  const s = plan.sampleSize;
  const p = plan.profile;
  const pct = (x: number) => `${Number((x * 100).toFixed(1))} %`;
  return (
    <p className="text-sm" data-testid="sample-size">
      <strong>{s.required} checkpoints</strong>: to show at least {pct(p.requiredShare)} within tolerance at{" "}
      {pct(p.confidence)} confidence (one-sided exact binomial) with {s.allowedFailures} checkpoint
      {s.allowedFailures === 1 ? "" : "s"} outside allowed for, {s.byShare} are needed
      {s.standardMinimum
        ? `; ${STANDARD_LABEL[s.standardMinimum.standard]} asks for at least ${s.standardMinimum.count}`
        : ""}
      ; the profile &ldquo;{p.name}&rdquo; asks for at least {s.profileMinimum}. Decided by{" "}
      {s.decidedBy === "share" ? "the share test" : s.decidedBy === "standard" ? "the standard" : "the profile"}.
    </p>
  );
}

export function StrataTable({ plan }: { plan: SurveyPlanDto }) {
  const by = plan.parameters.strataBy.map((a) => STRATUM_LABEL[a]).join(", ") || "none (one stratum)";
  return (
    <div>
      <p className="mb-2 text-sm text-ink-soft">
        Strata by {by}; at least {plan.parameters.minPerStratum} checkpoints and {plan.parameters.sparesPerStratum}{" "}
        spare(s) each; chosen plants at least {plan.parameters.minSpacingM} m apart
        {plan.parameters.bedEndM > 0 ? `; ${plan.parameters.bedEndM} m at each bed end left out` : ""}. Seed{" "}
        <span className="tabular-nums">{plan.seed}</span>.
      </p>
      <TableScroll label="Strata">
        <table className="w-full text-sm tabular-nums" data-testid="strata-table">
          <thead>
            <tr className="text-left text-ink-soft">
              <th className="py-1 pr-3 font-medium">Stratum</th>
              <th className="py-1 pr-3 text-right font-medium">Plants</th>
              <th className="py-1 pr-3 text-right font-medium">Checkpoints</th>
              <th className="py-1 pr-3 text-right font-medium">Spares</th>
              <th className="py-1 text-right font-medium">Minimum</th>
            </tr>
          </thead>
          <tbody>
            {plan.strata.map((s) => (
              <tr key={s.key} className="border-t border-chalk-line">
                <td className="py-1 pr-3">{s.key}</td>
                <td className="py-1 pr-3 text-right">{s.plants}</td>
                <td className="py-1 pr-3 text-right">{s.checkpoints}</td>
                <td className="py-1 pr-3 text-right">{s.spares}</td>
                <td className="py-1 text-right">{s.minimum}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </TableScroll>
    </div>
  );
}

/** A small plan view: checkpoints as filled dots, spares as rings, control marks as triangles; north up. */
export function PlanPlot({
  points,
  marks,
  width = 520,
  height = 320,
}: {
  points: PlanPointDto[];
  marks: ControlMarkDto[];
  width?: number;
  height?: number;
}) {
  const all = [...points.map((p) => [p.e, p.n]), ...marks.map((m) => [m.e, m.n])];
  if (all.length === 0) return null;
  const minE = Math.min(...all.map((a) => a[0]));
  const maxE = Math.max(...all.map((a) => a[0]));
  const minN = Math.min(...all.map((a) => a[1]));
  const maxN = Math.max(...all.map((a) => a[1]));
  const pad = 14;
  const scale = Math.min((width - 2 * pad) / Math.max(maxE - minE, 1), (height - 2 * pad) / Math.max(maxN - minN, 1));
  const x = (e: number) => pad + (e - minE) * scale;
  const y = (n: number) => height - pad - (n - minN) * scale;
  // Labels are HTML laid over the drawing, placed in percent of it, so they stay 12 px however far the drawing is
  // scaled down to fit a phone (no text under 12 px on screen).
  const at = (px: number, py: number) => ({ left: `${(px / width) * 100}%`, top: `${(py / height) * 100}%` });
  return (
    <div className="relative w-full max-w-xl overflow-hidden">
      <svg
        viewBox={`0 0 ${width} ${height}`}
        className="block w-full rounded-plot border border-chalk-line bg-white"
        role="img"
        aria-label={`Plan view: ${points.filter((p) => !p.spare).length} checkpoints, ${points.filter((p) => p.spare).length} spares, ${marks.length} control mark(s); north up`}
        data-testid="plan-plot"
      >
        {points.map((p) =>
          p.spare ? (
            <circle key={p.name} cx={x(p.e)} cy={y(p.n)} r={3} fill="none" stroke="#7a4b2a" strokeWidth={1.2} />
          ) : (
            <circle key={p.name} cx={x(p.e)} cy={y(p.n)} r={3} fill="#2f6b45" />
          ),
        )}
        {marks.map((m) => (
          <path
            key={m.id}
            d={`M ${x(m.e)} ${y(m.n) - 6} L ${x(m.e) + 5} ${y(m.n) + 4} L ${x(m.e) - 5} ${y(m.n) + 4} Z`}
            fill="#d99a1e"
            stroke="#1d2a24"
          />
        ))}
      </svg>
      {marks.map((m) => {
        // A mark near the right edge is named on its left, so the name stays inside the drawing.
        const right = x(m.e) > width * 0.7;
        return (
          <span
            key={m.id}
            aria-hidden="true"
            className="absolute whitespace-nowrap text-xs leading-none text-ink"
            style={{
              ...at(x(m.e) + (right ? -8 : 8), y(m.n)),
              transform: right ? "translate(-100%, -50%)" : "translateY(-50%)",
            }}
          >
            {m.name}
          </span>
        );
      })}
      <span aria-hidden="true" className="absolute right-2 top-1 text-xs text-ink">
        N ↑
      </span>
    </div>
  );
}

export function PointsTable({ points, compact = false }: { points: PlanPointDto[]; compact?: boolean }) {
  return (
    <table className={`w-full tabular-nums ${compact ? "text-xs" : "text-sm"}`} data-testid="plan-points">
      <thead>
        <tr className="text-left text-ink-soft">
          <th className="py-1 pr-2 font-medium">Point</th>
          <th className="py-1 pr-2 text-right font-medium">Easting</th>
          <th className="py-1 pr-2 text-right font-medium">Northing</th>
          <th className="py-1 pr-2 font-medium">Plant</th>
          <th className="py-1 pr-2 font-medium">Bed</th>
          <th className="py-1 pr-2 font-medium">Row</th>
          <th className="py-1 pr-2 font-medium">Arm</th>
          {compact ? <th className="py-1 font-medium">Found / note</th> : <th className="py-1 font-medium">Kind</th>}
        </tr>
      </thead>
      <tbody>
        {points.map((p) => (
          <tr key={p.name} className="border-t border-chalk-line">
            <td className="py-0.5 pr-2 font-medium">{p.name}</td>
            <td className="py-0.5 pr-2 text-right">{p.e.toFixed(3)}</td>
            <td className="py-0.5 pr-2 text-right">{p.n.toFixed(3)}</td>
            <td className="py-0.5 pr-2">{p.plantId}</td>
            <td className="py-0.5 pr-2">{p.bed ?? "–"}</td>
            <td className="py-0.5 pr-2">{p.row ?? "–"}</td>
            <td className="py-0.5 pr-2">{p.arm ?? "–"}</td>
            <td className="py-0.5">{compact ? "" : p.spare ? "spare" : "checkpoint"}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
