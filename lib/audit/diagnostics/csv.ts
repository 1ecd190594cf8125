/**
 * The diagnostics as one CSV table (RFC 4180, LF line ends, text cells neutralised for spreadsheets), millimetres.
 */
import { neutraliseCell } from "../residuals-csv";
import type { AuditDiagnostics } from "./diagnose";

/** Columns of the diagnostics CSV, in order. */
export const DIAGNOSTICS_CSV_COLUMNS = [
  "section",
  "arm",
  "bed",
  "row",
  "count",
  "mean_along_mm",
  "along_lower_mm",
  "along_upper_mm",
  "mean_cross_mm",
  "cross_lower_mm",
  "cross_upper_mm",
  "correction_along_mm",
  "correction_cross_mm",
  "first_plant",
  "last_plant",
  "start_utc",
  "end_utc",
  "note",
] as const;

type Cell = string | number | null;

function text(v: Cell): string {
  if (v === null) return "";
  if (typeof v === "number") return Number.isFinite(v) ? String(Math.round(v * 1000) / 1000) : "";
  const safe = neutraliseCell(v);
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

const mm = (m: number | null | undefined) => (m === null || m === undefined ? null : m * 1000);
const iso = (t: number | null) => (t === null ? null : new Date(t).toISOString());

/**
 * Rows: "arm" (RTK-fixed pairs, with the suggested correction), "arm-degraded" (degraded-fix pairs), "bed-row",
 * "episode" (one row per bed and row of each episode). Means and interval ends in mm rounded to 0.001 mm.
 *
 * @example diagnosticsCsv(d).split("\n")[0] // "section,arm,bed,row,count,mean_along_mm,…"
 */
export function diagnosticsCsv(d: AuditDiagnostics): string {
  const lines: Cell[][] = [];
  for (const a of d.arms) {
    lines.push([
      "arm",
      a.arm,
      null,
      null,
      a.along.n,
      mm(a.along.mean),
      mm(a.along.lower),
      mm(a.along.upper),
      mm(a.cross.mean),
      mm(a.cross.lower),
      mm(a.cross.upper),
      mm(a.suggestion.along?.m),
      mm(a.suggestion.cross?.m),
      null,
      null,
      null,
      null,
      a.sentence,
    ]);
    if (a.degraded.cross.n > 0)
      lines.push([
        "arm-degraded",
        a.arm,
        null,
        null,
        a.degraded.cross.n,
        mm(a.degraded.along.mean),
        mm(a.degraded.along.lower),
        mm(a.degraded.along.upper),
        mm(a.degraded.cross.mean),
        mm(a.degraded.cross.lower),
        mm(a.degraded.cross.upper),
        null,
        null,
        null,
        null,
        null,
        null,
        "pairs planted with a degraded fix",
      ]);
  }
  for (const c of d.bedRow)
    lines.push([
      "bed-row",
      null,
      c.bed,
      c.row,
      c.pairs,
      mm(c.meanAlong),
      null,
      null,
      mm(c.meanCross),
      null,
      null,
      null,
      null,
      null,
      null,
      null,
      null,
      `RMSE_r ${(c.rmseR * 1000).toFixed(1)} mm; ${c.degraded} degraded-fix pairs`,
    ]);
  for (const e of d.episodes)
    for (const p of e.parts)
      lines.push([
        "episode",
        p.arm,
        p.bed,
        p.row,
        p.count,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        p.firstPlantId,
        p.lastPlantId,
        iso(p.start),
        iso(p.end),
        e.kind === "degraded-fix" ? `degraded fix (${e.fixValues.join(", ")})` : "jump in error",
      ]);
  return `${[DIAGNOSTICS_CSV_COLUMNS.join(","), ...lines.map((l) => l.map(text).join(","))].join("\n")}\n`;
}
