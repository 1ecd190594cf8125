/**
 * The one trust rule of Plotproof: can the records of a group of checkpoints be trusted for a tolerance profile's
 * operation? Used by the verdict, every breakdown table, the map guidance, the report and the summary. Pure.
 *
 * The profile's claim "at least `requiredShare` of plants are within every limit, with `confidence`" is one-sided,
 * so the decision uses the one-sided exact (Clopper–Pearson) lower bound at the profile's confidence,
 * Beta⁻¹(α; k, n − k + 1), α = 1 − confidence — not the lower end of the two-sided interval (α/2). The two-sided
 * interval is returned as a description only.
 *
 * Judgement (our words):
 *  - "meets": the one-sided lower bound reaches the required share;
 *  - "does not meet": the observed share is already below the required share (or, for a group, the 95th percentile
 *    of a limited error exceeds its limit, as in the verdict);
 *  - "not enough evidence yet": neither — the checkpoints look fine but are too few to show the share at the
 *    profile's confidence; `moreNeeded` says how many more checkpoints, all within tolerance, would settle it.
 *
 * Sources: Clopper & Pearson, Biometrika 26 (1934) 404–413 (exact bounds); the one-sided form with its closed form
 * α^(1/n) for n of n within: Turpin, Patin, Jens & Turpin, "A modified rule of three for the one-sided binomial
 * confidence interval"; Collins, ARL-TR-5214 (2010) "Binomial distribution: hypothesis testing, confidence intervals
 * (CI), and reliability". Applying the verdict's criteria to every group is our rule (common practice, no source).
 */
import { clopperPearson, type Interval } from "./intervals";
import { invRegIncBeta } from "./special";

/** The three words of the trust rule. */
export const TRUST_WORDS = ["meets", "does not meet", "not enough evidence yet"] as const;
export type TrustWord = (typeof TRUST_WORDS)[number];

/** The part of a tolerance profile the share test needs. */
export interface ShareRequirement {
  /** Share of plants within every limit the one-sided lower bound must reach, 0 < s ≤ 1. */
  requiredShare: number;
  /** Confidence of the one-sided bound, e.g. 0.95. */
  confidence: number;
}

/** The share test of one group of checkpoints. */
export interface ShareTrust {
  /** Checkpoints with a tolerance result. */
  n: number;
  /** Of them outside the profile's limits. */
  outside: number;
  /** (n − outside) / n; null when n = 0. */
  share: number | null;
  requiredShare: number;
  confidence: number;
  /** One-sided exact lower bound of the share at `confidence` (the decision bound); null when n = 0. */
  lowerBound: number | null;
  /** Two-sided Clopper–Pearson interval at `confidence`, a description only; null when n = 0. */
  interval: Interval | null;
  word: TrustWord;
  /** When "not enough evidence yet": more checkpoints, all within tolerance, that would make it "meets"; else null. */
  moreNeeded: number | null;
}

function assertCounts(n: number, outside: number): void {
  if (!Number.isInteger(n) || !Number.isInteger(outside) || n < 0 || outside < 0 || outside > n)
    throw new Error(`trust: need integers 0 ≤ outside ≤ n, got n=${n}, outside=${outside}`);
}

function assertRequirement(r: ShareRequirement): void {
  if (!(r.requiredShare > 0 && r.requiredShare <= 1))
    throw new Error(`trust: required share must lie in (0, 1], got ${r.requiredShare}`);
  if (!(r.confidence > 0 && r.confidence < 1))
    throw new Error(`trust: confidence must lie in (0, 1), got ${r.confidence}`);
}

/**
 * One-sided exact lower confidence bound of a binomial share k/n: Beta⁻¹(α; k, n − k + 1), α = 1 − confidence;
 * 0 when k = 0; α^(1/n) when k = n. Null when n = 0.
 *
 * Source: Clopper & Pearson (1934); one-sided form as in Collins, ARL-TR-5214 (2010).
 *
 * @example oneSidedLowerBound(59, 59, 0.95) // 0.05^(1/59) ≈ 0.95046
 */
export function oneSidedLowerBound(k: number, n: number, confidence: number): number | null {
  assertCounts(n, n - k);
  if (!(confidence > 0 && confidence < 1)) throw new Error(`trust: confidence must lie in (0, 1), got ${confidence}`);
  if (n === 0) return null;
  if (k === 0) return 0;
  const alpha = 1 - confidence;
  if (k === n) return alpha ** (1 / n);
  return invRegIncBeta(alpha, k, n - k + 1);
}

/**
 * Fewest more checkpoints, all within tolerance, after which `outside` of `n + more` gives a one-sided lower bound
 * reaching the required share. Null when no number can (required share 1). 0 when it already does.
 *
 * @example moreCheckpointsNeeded(0, 0, { requiredShare: 0.95, confidence: 0.95 }) // 59
 */
export function moreCheckpointsNeeded(n: number, outside: number, req: ShareRequirement): number | null {
  assertCounts(n, outside);
  assertRequirement(req);
  if (req.requiredShare >= 1) return null;
  const meets = (m: number) => (oneSidedLowerBound(n + m - outside, n + m, req.confidence) ?? 0) >= req.requiredShare;
  if (meets(0)) return 0;
  // The bound rises with every checkpoint within tolerance: grow an upper end, then bisect.
  let lo = 0;
  let hi = 1;
  while (!meets(hi)) {
    lo = hi;
    hi *= 2;
    if (hi > 1e9) return null;
  }
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (meets(mid)) hi = mid;
    else lo = mid;
  }
  return hi;
}

/**
 * The share test of one group: `n` checkpoints, `outside` of them outside the profile's limits.
 *
 * @example shareTrust({ n: 59, outside: 0 }, { requiredShare: 0.95, confidence: 0.95 }).word // "meets"
 * @example shareTrust({ n: 58, outside: 0 }, { requiredShare: 0.95, confidence: 0.95 }).moreNeeded // 1
 */
export function shareTrust(group: { n: number; outside: number }, req: ShareRequirement): ShareTrust {
  const { n, outside } = group;
  assertCounts(n, outside);
  assertRequirement(req);
  const k = n - outside;
  const share = n === 0 ? null : k / n;
  const lowerBound = oneSidedLowerBound(k, n, req.confidence);
  let word: TrustWord;
  if (lowerBound !== null && lowerBound >= req.requiredShare) word = "meets";
  else if (share !== null && share < req.requiredShare) word = "does not meet";
  else word = "not enough evidence yet";
  return {
    n,
    outside,
    share,
    requiredShare: req.requiredShare,
    confidence: req.confidence,
    lowerBound,
    interval: clopperPearson(k, n, req.confidence),
    word,
    moreNeeded: word === "not enough evidence yet" ? moreCheckpointsNeeded(n, outside, req) : null,
  };
}

/** A limit of a profile a group's 95th percentile exceeds. Metres. */
export interface LimitExceeded {
  limit: "radial" | "cross" | "along";
  p95: number;
  limitM: number;
}

/** The trust of one group: the share test and the profile's limits on the 95th percentiles. */
export interface GroupTrust extends ShareTrust {
  /** Limits whose 95th percentile the group exceeds, worst first (largest p95 / limit). */
  exceeded: LimitExceeded[];
}

/**
 * The trust rule for one group (a breakdown row, a bed, all pairs): the share test of {@link shareTrust}, and
 * "does not meet" when the empirical 95th percentile of a limited error is over its limit (the verdict's other
 * criteria). `p95*` null = no figure (not judged). Metres.
 *
 * @example groupTrust({ n: 80, outside: 0, p95Radial: 0.004, p95Cross: null, p95Along: null }, profile).word // "meets"
 */
export function groupTrust(
  group: { n: number; outside: number; p95Radial: number | null; p95Cross: number | null; p95Along: number | null },
  profile: ShareRequirement & { radialM: number | null; crossM: number | null; alongM: number | null },
): GroupTrust {
  const base = shareTrust(group, profile);
  const exceeded: LimitExceeded[] = [];
  const tests: [LimitExceeded["limit"], number | null, number | null][] = [
    ["radial", group.p95Radial, profile.radialM],
    ["cross", group.p95Cross, profile.crossM],
    ["along", group.p95Along, profile.alongM],
  ];
  for (const [limit, p95, limitM] of tests)
    if (p95 !== null && limitM !== null && p95 > limitM) exceeded.push({ limit, p95, limitM });
  exceeded.sort((a, b) => b.p95 / b.limitM - a.p95 / a.limitM);
  if (exceeded.length === 0) return { ...base, exceeded };
  return { ...base, exceeded, word: "does not meet", moreNeeded: null };
}
