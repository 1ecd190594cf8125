/**
 * The verdict of an audit against a tolerance profile: each criterion passed or failed, in plain
 * words with the figures behind it. Pure.
 *
 * Criteria (common practice, no source; NSSDA itself sets no thresholds, FGDC-STD-007.3-1998 §3.1):
 *  - checkpoints: number of pairs ≥ the profile's minimum;
 *  - share: the trust rule of trust.ts — the one-sided exact lower bound of the share of plants within every limit
 *    at the profile's confidence ≥ the required share ("meets"); the criterion carries the rule's word;
 *  - radial / cross / along: the empirical 95th percentile (Hyndman–Fan type 7) of |error| ≤ the limit.
 */
import type { ToleranceProfile } from "./profile";
import { quantiles, quantilesInPlace } from "./quantiles";
import { shareTrust, type ShareTrust } from "./trust";

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
  /** The share criterion's trust judgement (trust.ts); absent on other criteria and in verdicts stored before it. */
  trust?: ShareTrust;
}

export interface Verdict {
  passed: boolean;
  criteria: Criterion[];
}

const mm = (m: number) => `${(m * 1000).toFixed(1)} mm`;
const pct = (s: number) => `${(s * 100).toFixed(1)} %`;

function p95Abs(values: Float64Array | null): number | null {
  if (!values || values.length === 0) return null;
  // Selection, not a full sort: three sorts of a million values were most of the verdict's time.
  return quantilesInPlace(Float64Array.from(values, Math.abs), [0.95])[0];
}

/**
 * @param pairs number of pairs
 * @param within pairs tested and pairs within every limit, from the summary's withinTolerance (null without limits)
 * @example evaluateVerdict(profile, { pairs: 212, radial, cross: null, along: null, within: { n: 212, within: 209 } })
 */
export function evaluateVerdict(
  profile: ToleranceProfile,
  input: {
    pairs: number;
    radial: Float64Array;
    cross: Float64Array | null;
    along: Float64Array | null;
    within: { n: number; within: number } | null;
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
    const observed = id === "radial" ? (values?.length ? quantiles(values, [0.95])[0] : null) : p95Abs(values);
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
    const t = w && w.n > 0 ? shareTrust({ n: w.n, outside: w.n - w.within }, profile) : null;
    criteria.push({
      id: "share",
      passed: t?.word === "meets",
      observed: t ? t.lowerBound : null,
      limit: profile.requiredShare,
      unit: "share",
      text: t ? shareSentence(t) : `share within tolerance unknown; the profile asks for ${pct(profile.requiredShare)}`,
      ...(t ? { trust: t } : {}),
    });
  }
  return { passed: criteria.every((c) => c.passed), criteria };
}

/**
 * The share criterion in one sentence: figures, the decision bound, the word and what would settle it.
 *
 * @example shareSentence(shareTrust({ n: 58, outside: 0 }, { requiredShare: 0.95, confidence: 0.95 }))
 *   // "100.0 % of plants within every limit (58 of 58); with 95 % confidence at least 94.9 % (one-sided bound); the profile asks for 95.0 % — not enough evidence yet: 1 more checkpoint, all within tolerance, would settle it"
 */
export function shareSentence(t: ShareTrust): string {
  const conf = `${Math.round(t.confidence * 1000) / 10} %`;
  const head = `${pct(t.share ?? 0)} of plants within every limit (${t.n - t.outside} of ${t.n}); with ${conf} confidence at least ${pct(t.lowerBound ?? 0)} (one-sided bound); the profile asks for ${pct(t.requiredShare)} — ${t.word}`;
  if (t.word !== "not enough evidence yet") return head;
  if (t.moreNeeded === null) return `${head}: no number of checkpoints can show it`;
  return `${head}: ${t.moreNeeded} more ${t.moreNeeded === 1 ? "checkpoint" : "checkpoints"}, all within tolerance, would settle it`;
}
