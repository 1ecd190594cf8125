/**
 * Per tool arm: along-row and cross-row bias with t intervals on fixed-fix pairs, the degraded-fix pairs shown apart,
 * and a suggested calibration correction where the bias is significant.
 */
import { type MeanInterval, meanInterval } from "./mean-interval";
import { type DiagnosticPair, fixClass } from "./types";

/** A calibration correction for one component: add `m` to the arm's recorded positions. Metres. */
export interface OffsetSuggestion {
  /** Mean error survey − planted: the shift that moves the records onto the plants. */
  m: number;
  /** Half width of its confidence interval. */
  uncertaintyM: number;
}

export interface ArmDiagnostics {
  /** Arm value as recorded; null = no arm in the record. */
  arm: string | null;
  /** "fixed": RTK-fixed pairs only; "all": the records state no fix quality, so every pair is used. */
  basis: "fixed" | "all";
  along: MeanInterval;
  cross: MeanInterval;
  /** Pairs planted with a degraded fix (float, DGNSS…), kept apart. */
  degraded: { along: MeanInterval; cross: MeanInterval };
  /** Significant components only; null components mean "no significant offset". */
  suggestion: { along: OffsetSuggestion | null; cross: OffsetSuggestion | null };
  /** The finding in one plain sentence. */
  sentence: string;
}

const collator = new Intl.Collator("en", { numeric: true });

function mm(m: number): string {
  return `${(m * 1000).toFixed(1)} mm`;
}

function suggestion(mi: MeanInterval): OffsetSuggestion | null {
  return mi.significant && mi.mean !== null && mi.halfWidth !== null
    ? { m: mi.mean, uncertaintyM: mi.halfWidth }
    : null;
}

function describeArm(arm: string | null, s: ArmDiagnostics["suggestion"], n: number): string {
  const name = arm === null ? "Records without an arm" : `Arm ${arm}`;
  if (n < 2) return `${name}: too few fixed-fix checkpoints (${n}) to test for an offset.`;
  const parts: string[] = [];
  if (s.cross)
    parts.push(
      `move its records ${mm(Math.abs(s.cross.m))} ± ${mm(s.cross.uncertaintyM).replace(" mm", "")} mm to the ${s.cross.m > 0 ? "right" : "left"} of the row direction`,
    );
  if (s.along)
    parts.push(
      `${parts.length ? "and " : "move its records "}${mm(Math.abs(s.along.m))} ± ${mm(s.along.uncertaintyM).replace(" mm", "")} mm ${s.along.m > 0 ? "forward" : "back"} along the row`,
    );
  if (!parts.length) return `${name}: no significant offset.`;
  return `${name}: ${parts.join(" ")} (calibration correction).`;
}

/**
 * Bias of each tool arm in the row frame. Means and two-sided t intervals at `confidence` (Student 1908) of the
 * along-row and cross-row errors of RTK-fixed pairs; pairs planted with a degraded fix are summarised apart, so a
 * float stretch does not hide or fake a calibration offset. When no pair records a fix quality every pair is used.
 * A component whose interval excludes 0 gives a correction (the mean error, to add to the arm's records) with the
 * interval's half width as its uncertainty. Arms in natural order, the arm-less group last. Input not modified.
 *
 * Source: intervals and test as in mean-interval.ts (Student 1908; NIST/SEMATECH e-Handbook §1.3.5.2).
 *
 * @example armDiagnostics(pairs, 0.95)[2].suggestion.cross // { m: -0.0029, uncertaintyM: 0.0006 }
 */
export function armDiagnostics(pairs: readonly DiagnosticPair[], confidence = 0.95): ArmDiagnostics[] {
  const anyFix = pairs.some((p) => fixClass(p.fix) !== "unknown");
  const groups = new Map<string | null, { fa: number[]; fc: number[]; da: number[]; dc: number[] }>();
  for (const p of pairs) {
    if (p.along === null || p.cross === null) continue;
    let g = groups.get(p.arm);
    if (!g) groups.set(p.arm, (g = { fa: [], fc: [], da: [], dc: [] }));
    const cls = fixClass(p.fix);
    if (!anyFix || cls === "fixed") {
      g.fa.push(p.along);
      g.fc.push(p.cross);
    } else if (cls === "degraded") {
      g.da.push(p.along);
      g.dc.push(p.cross);
    }
  }
  const keys = [...groups.keys()].sort((a, b) => (a === null ? 1 : b === null ? -1 : collator.compare(a, b)));
  return keys.map((arm) => {
    const g = groups.get(arm)!;
    const along = meanInterval(g.fa, confidence);
    const cross = meanInterval(g.fc, confidence);
    const s = { along: suggestion(along), cross: suggestion(cross) };
    return {
      arm,
      basis: anyFix ? "fixed" : "all",
      along,
      cross,
      degraded: { along: meanInterval(g.da, confidence), cross: meanInterval(g.dc, confidence) },
      suggestion: s,
      sentence: describeArm(arm, s, along.n),
    };
  });
}
