/**
 * The verdict of an audit against a tolerance profile: each criterion passed or failed, in plain
 * words with the figures behind it. Pure.
 *
 * Criteria (common practice, no source; NSSDA itself sets no thresholds, FGDC-STD-007.3-1998 §3.1):
 *  - checkpoints: number of pairs ≥ the profile's minimum;
 *  - share: the lower confidence bound of the share of plants within every limit ≥ the required share;
 *  - radial / cross / along: the empirical 95th percentile (Hyndman–Fan type 7) of |error| ≤ the limit.
 */
import type { ToleranceProfile } from "./profile";
import { quantileSorted } from "./quantiles";

export interface Criterion {
  id: "checkpoints" | "share" | "radial" | "cross" | "along";
  passed: boolean;
  /** The figure measured: a count, a share (0–1) or metres. */
  observed: number | null;
  /** The profile's limit in the same unit. */
  limit: number;
  unit: "count" | "share" | "m";
  /** One plain sentence with the figures, e.g. "95 % of cross-row errors within 4.1 mm; limit 6.0 mm". */
  text: string;
}

export interface Verdict {
  passed: boolean;
  criteria: Criterion[];
}

const mm = (m: number) => `${(m * 1000).toFixed(1)} mm`;
const pct = (s: number) => `${(s * 100).toFixed(1)} %`;

function p95Abs(values: Float64Array | null): number | null {
  if (!values || values.length === 0) return null;
  const abs = Float64Array.from(values, Math.abs).sort();
  return quantileSorted(abs, 0.95);
}

/**
 * @param pairs number of pairs
 * @param within lower confidence bound and share from the summary's withinTolerance (null without limits)
 * @example evaluateVerdict(profile, { pairs: 212, radial, cross: null, along: null, within: { share: 0.97, lower95: 0.94 } })
 */
export function evaluateVerdict(
  profile: ToleranceProfile,
  input: {
    pairs: number;
    radial: Float64Array;
    cross: Float64Array | null;
    along: Float64Array | null;
    within: { share: number; lower95: number } | null;
  },
): Verdict {
  const criteria: Criterion[] = [];
  const enough = input.pairs >= profile.minCheckpoints;
  criteria.push({
    id: "checkpoints",
    passed: enough,
    observed: input.pairs,
    limit: profile.minCheckpoints,
    unit: "count",
    text: enough
      ? `${input.pairs} checkpoints paired; the profile asks for at least ${profile.minCheckpoints}`
      : `only ${input.pairs} checkpoints paired; the profile asks for ${profile.minCheckpoints}`,
  });
  const limits: [Criterion["id"], number | null, Float64Array | null, string][] = [
    ["radial", profile.radialM, input.radial, "radial errors"],
    ["cross", profile.crossM, input.cross, "cross-row errors"],
    ["along", profile.alongM, input.along, "along-row errors"],
  ];
  for (const [id, limit, values, words] of limits) {
    if (limit === null) continue;
    const observed =
      id === "radial"
        ? values?.length
          ? quantileSorted(Float64Array.from(values).sort(), 0.95)
          : null
        : p95Abs(values);
    const passed = observed !== null && observed <= limit;
    criteria.push({
      id,
      passed,
      observed,
      limit,
      unit: "m",
      text:
        observed === null
          ? `${words}: no figure (${id === "radial" ? "no pairs" : "no row bearing"}); limit ${mm(limit)}`
          : `95 % of ${words} within ${mm(observed)}; limit ${mm(limit)}`,
    });
  }
  if (profile.radialM !== null || profile.crossM !== null || profile.alongM !== null) {
    const w = input.within;
    const passed = !!w && w.lower95 >= profile.requiredShare;
    const conf = `${Math.round(profile.confidence * 100)} %`;
    criteria.push({
      id: "share",
      passed,
      observed: w ? w.lower95 : null,
      limit: profile.requiredShare,
      unit: "share",
      text: w
        ? `${pct(w.share)} of plants within every limit; with ${conf} confidence at least ${pct(w.lower95)}; the profile asks for ${pct(profile.requiredShare)}`
        : `share within tolerance unknown; the profile asks for ${pct(profile.requiredShare)}`,
    });
  }
  return { passed: criteria.every((c) => c.passed), criteria };
}
