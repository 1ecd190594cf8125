/**
 * Breakdown of the accuracy statistics by a record attribute (tool arm, crop, bed, fix, planting day, ...).
 * One pass of sums per attribute plus selection-based percentiles per group: no per-pair objects.
 */
import { clopperPearson } from "./intervals";
import { groupTrust, oneSidedLowerBound, type GroupTrust, type ShareRequirement } from "./trust";
import { quantilesInPlace } from "./quantiles";
import type { ErrorColumns } from "./error-columns";

/** Statistics of one group. Metres unless stated. */
export interface GroupRow {
  /** Attribute value (e.g. "L" for a tool arm, "2025-05-13" for a day); null = value missing in the file. */
  key: string | null;
  /** Number of pairs in the group. */
  pairs: number;
  /** Mean dE (bias east). */
  meanDE: number;
  /** Mean dN (bias north). */
  meanDN: number;
  /** sqrt(RMSE_E² + RMSE_N²). */
  rmseR: number;
  /** RMSE of the cross-row error; null without a row bearing. */
  rmseCross: number | null;
  /** RMSE of the along-row error; null without a row bearing. */
  rmseAlong: number | null;
  /** Empirical 50th percentile of radial errors (type 7). */
  cep50: number;
  /** Empirical 95th percentile of radial errors (type 7). */
  r95: number;
  /** Share within tolerance; null without tolerance limits. */
  withinShare: number | null;
  /** Lower end of the two-sided Clopper–Pearson interval of withinShare (a description); null without limits. */
  lower95: number | null;
  /** Upper end of the two-sided Clopper–Pearson interval of withinShare (a description); null without limits. */
  upper95: number | null;
  // Added with the trust rule (trust.ts); absent in summaries stored before, so optional when read.
  /** Pairs within every tolerance limit; null without tolerance limits. */
  within?: number | null;
  /** One-sided exact lower bound of withinShare at the audit's confidence (the decision bound); null without limits. */
  lowerOneSided?: number | null;
  /** Empirical 95th percentile of |cross-row error| (type 7); null without a row bearing. */
  p95Cross?: number | null;
  /** Empirical 95th percentile of |along-row error| (type 7); null without a row bearing. */
  p95Along?: number | null;
}

const keyCollator = new Intl.Collator("en", { numeric: true, sensitivity: "variant" });

/**
 * Statistics per group. `codes[i]` is the group of pair i (index into `values`, −1 = missing value); groups with no
 * pairs are left out; rows are ordered by key in natural order ("2" before "10"), the missing-value group last.
 * Percentiles: Hyndman & Fan type 7. Interval: two-sided Clopper–Pearson at `confidence` (a description) and the
 * one-sided exact lower bound (the decision bound, trust.ts). Inputs are not modified; `scratch`
 * (length ≥ n), when given, is used as work space and overwritten.
 *
 * Source: formulas as in rmse.ts, radii.ts and intervals.ts (FGDC-STD-007.3-1998; Hyndman & Fan 1996; Clopper & Pearson 1934).
 *
 * @example groupStatistics(Int32Array.of(0, 0, 1), ["L", "R"], errors, 0.95) // [{ key: "L", pairs: 2, ... }, { key: "R", pairs: 1, ... }]
 */
export function groupStatistics(
  codes: Int32Array,
  values: readonly string[],
  errors: ErrorColumns,
  confidence: number,
  scratch?: Float64Array,
): GroupRow[] {
  const n = codes.length;
  const { dE, dN, along, cross, radial, within } = errors;
  if (dE.length !== n || dN.length !== n || radial.length !== n)
    throw new Error("groupStatistics: column lengths differ");
  const g = values.length + 1; // last slot = missing value
  const missing = values.length;
  const slot = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const code = codes[i];
    if (code < -1 || code >= missing) throw new Error(`groupStatistics: code ${code} out of range`);
    slot[i] = code < 0 ? missing : code;
  }
  const count = new Float64Array(g);
  const sumE = new Float64Array(g);
  const sumN = new Float64Array(g);
  const sumE2 = new Float64Array(g);
  const sumN2 = new Float64Array(g);
  const sumA2 = new Float64Array(g);
  const sumC2 = new Float64Array(g);
  const inside = new Float64Array(g);
  for (let i = 0; i < n; i++) {
    const s = slot[i];
    const e = dE[i];
    const nn = dN[i];
    count[s]++;
    sumE[s] += e;
    sumN[s] += nn;
    sumE2[s] += e * e;
    sumN2[s] += nn * nn;
  }
  if (along !== null) for (let i = 0; i < n; i++) sumA2[slot[i]] += along[i] * along[i];
  if (cross !== null) for (let i = 0; i < n; i++) sumC2[slot[i]] += cross[i] * cross[i];
  if (within !== null) for (let i = 0; i < n; i++) inside[slot[i]] += within[i];
  // Radial errors laid out group by group for the percentiles.
  const offset = new Int32Array(g + 1);
  for (let s = 0; s < g; s++) offset[s + 1] = offset[s] + count[s];
  const cursor = offset.slice(0, g);
  const grouped = scratch && scratch.length >= n ? scratch.subarray(0, n) : new Float64Array(n);
  for (let i = 0; i < n; i++) grouped[cursor[slot[i]]++] = radial[i];
  const absGrouped = (column: Float64Array | null): Float64Array | null => {
    if (column === null) return null;
    const out = new Float64Array(n);
    const at = offset.slice(0, g);
    for (let i = 0; i < n; i++) out[at[slot[i]]++] = Math.abs(column[i]);
    return out;
  };
  const crossGrouped = absGrouped(cross);
  const alongGrouped = absGrouped(along);
  const p95Of = (col: Float64Array | null, s: number) =>
    col ? quantilesInPlace(col.subarray(offset[s], offset[s + 1]), [0.95])[0] : null;

  const rows: GroupRow[] = [];
  for (let s = 0; s < g; s++) {
    const m = count[s];
    if (m === 0) continue;
    const [cep50, r95] = quantilesInPlace(grouped.subarray(offset[s], offset[s + 1]), [0.5, 0.95]);
    const ci = within ? clopperPearson(inside[s], m, confidence) : null;
    rows.push({
      key: s < values.length ? values[s] : null,
      pairs: m,
      meanDE: sumE[s] / m,
      meanDN: sumN[s] / m,
      rmseR: Math.sqrt((sumE2[s] + sumN2[s]) / m),
      rmseCross: cross ? Math.sqrt(sumC2[s] / m) : null,
      rmseAlong: along ? Math.sqrt(sumA2[s] / m) : null,
      cep50,
      r95,
      withinShare: within ? inside[s] / m : null,
      lower95: ci ? ci.lower : null,
      upper95: ci ? ci.upper : null,
      within: within ? inside[s] : null,
      lowerOneSided: within ? oneSidedLowerBound(inside[s], m, confidence) : null,
      p95Cross: p95Of(crossGrouped, s),
      p95Along: p95Of(alongGrouped, s),
    });
  }
  rows.sort((a, b) => {
    if (a.key === null) return b.key === null ? 0 : 1;
    if (b.key === null) return -1;
    return keyCollator.compare(a.key, b.key) || (a.key < b.key ? -1 : a.key > b.key ? 1 : 0);
  });
  return rows;
}

/**
 * The trust rule (trust.ts, groupTrust) for one breakdown row against a profile. Rows stored before the rule carry
 * no `within` count nor cross/along percentiles: the count is recovered from withinShare · pairs, and the missing
 * percentiles are not judged. Null when the row has no tolerance result.
 *
 * @example groupRowTrust(row, profile)?.word // "meets"
 */
export function groupRowTrust(
  row: GroupRow,
  profile: ShareRequirement & { radialM: number | null; crossM: number | null; alongM: number | null },
): GroupTrust | null {
  if (row.withinShare === null) return null;
  const within = row.within ?? Math.round(row.withinShare * row.pairs);
  return groupTrust(
    {
      n: row.pairs,
      outside: row.pairs - within,
      p95Radial: row.r95,
      p95Cross: row.p95Cross ?? null,
      p95Along: row.p95Along ?? null,
    },
    profile,
  );
}
