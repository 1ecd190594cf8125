"use client";
import { useMemo, useState } from "react";
import { type ClearanceMode, clearanceShare, type DiagnosticPair, type PassPoint } from "@/lib/audit/diagnostics";

const MODES: { mode: ClearanceMode; label: string }[] = [
  { mode: "cross", label: "across the row (inter-row hoeing)" },
  { mode: "along", label: "along the row (in-row blades)" },
  { mode: "radial", label: "all round the plant" },
];

const pct = (x: number | null) => (x === null ? "–" : `${(x * 100).toFixed(1)} %`);

/** The share of plants a tool keeping a chosen clearance would touch, from the measured errors (both methods). */
export function ClearancePanel({ pass, confidence }: { pass: PassPoint[]; confidence: number }) {
  const [mm, setMm] = useState("20");
  const [mode, setMode] = useState<ClearanceMode>("cross");
  const pairs = useMemo(
    () =>
      pass.map(
        (p) =>
          ({ along: p.along, cross: p.cross, radial: p.radial }) as Pick<DiagnosticPair, "along" | "cross" | "radial">,
      ) as DiagnosticPair[],
    [pass],
  );
  const value = Number(mm.replace(",", "."));
  const valid = Number.isFinite(value) && value >= 0 && value <= 1000;
  const r = valid ? clearanceShare(pairs, value / 1000, mode, confidence) : null;
  return (
    <div className="space-y-3 text-sm">
      <div className="flex flex-wrap items-end gap-4">
        <label className="flex flex-col gap-1">
          <span className="font-medium">Clearance kept from each plant (mm)</span>
          <input
            className="w-28 rounded-plot border border-chalk-line px-2 py-1 tabular-nums"
            inputMode="decimal"
            value={mm}
            onChange={(e) => setMm(e.target.value)}
            aria-invalid={!valid}
            aria-describedby="clearance-help"
            data-testid="clearance-mm"
          />
        </label>
        <label className="flex flex-col gap-1">
          <span className="font-medium">The tool works</span>
          <select
            className="rounded-plot border border-chalk-line px-2 py-1"
            value={mode}
            onChange={(e) => setMode(e.target.value as ClearanceMode)}
            data-testid="clearance-mode"
          >
            {MODES.map((m) => (
              <option key={m.mode} value={m.mode}>
                {m.label}
              </option>
            ))}
          </select>
        </label>
      </div>
      <p id="clearance-help" className="text-ink-soft">
        {valid
          ? "A plant is touched when its recorded position is off by at least the clearance. Add the plant's own half-width to the clearance."
          : `“${mm}” is not a clearance: enter a number of millimetres between 0 and 1000.`}
      </p>
      {r?.empirical ? (
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1" data-testid="clearance-result">
          <dt className="text-ink-soft">Measured (checkpoints)</dt>
          <dd className="tabular-nums">
            {pct(r.empirical.share)} of plants touched ({r.empirical.touched} of {r.pairs};{" "}
            {Math.round(confidence * 100)} % interval {pct(r.empirical.lower)} – {pct(r.empirical.upper)})
          </dd>
          <dt className="text-ink-soft">Normal model</dt>
          <dd className="tabular-nums">{pct(r.model)} of plants touched</dd>
        </dl>
      ) : valid ? (
        <p className="text-ink-faint">No checkpoints with this error component (the audit has no row bearing).</p>
      ) : null}
    </div>
  );
}
