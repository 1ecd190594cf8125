/**
 * Share of plants within the tolerance of the next field operation, with an exact binomial interval.
 */
import { clopperPearson } from "./intervals";
import { oneSidedLowerBound } from "./trust";

/** Tolerance limits in metres; null = not tested. A plant is within tolerance when every given limit holds. */
export interface ToleranceLimits {
  /** Largest radial error sqrt(dE² + dN²). */
  radial: number | null;
  /** Largest |cross-row error|. */
  cross: number | null;
  /** Largest |along-row error|. */
  along: number | null;
}

/**
 * Share within tolerance. Key names lower95/upper95 are kept whatever `confidence` is; they are the two-sided
 * interval, a description. The decision bound is `lowerOneSided` (see trust.ts).
 */
export interface WithinTolerance {
  /** within / n; null when n = 0. */
  share: number | null;
  /** Lower end of the two-sided Clopper–Pearson interval at `confidence`; null when n = 0. */
  lower95: number | null;
  /** Upper end of the two-sided Clopper–Pearson interval at `confidence`; null when n = 0. */
  upper95: number | null;
  /**
   * One-sided exact lower bound at `confidence`, the bound the verdict decides on; null when n = 0.
   * Absent in summaries stored before it was added.
   */
  lowerOneSided?: number | null;
  /** Number of pairs within every given limit. */
  within: number;
  /** Number of pairs tested. */
  n: number;
  /** Confidence level of the interval, e.g. 0.95. */
  confidence: number;
  limits: ToleranceLimits;
}

/**
 * True when at least one tolerance limit (metres) is set.
 *
 * @example hasLimits({ radial: 0.03, cross: null, along: null }) // true
 */
export function hasLimits(limits: ToleranceLimits): boolean {
  return limits.radial !== null || limits.cross !== null || limits.along !== null;
}

/**
 * Per-pair flags: 1 when radial ≤ limits.radial, |cross| ≤ limits.cross and |along| ≤ limits.along (each only when
 * set), else 0. Metres. Cross/along limits need the along/cross arrays. Inputs are not modified.
 *
 * Source: the tolerances are the user's (FGDC-STD-007.3-1998 §3.1 defines no thresholds).
 *
 * @example withinToleranceFlags({ radial: Float64Array.of(0.01, 0.04), along: null, cross: null, limits: { radial: 0.03, cross: null, along: null } })
 *   // Uint8Array [1, 0]
 */
export function withinToleranceFlags(input: {
  radial: Float64Array;
  along: Float64Array | null;
  cross: Float64Array | null;
  limits: ToleranceLimits;
}): Uint8Array {
  const { radial, along, cross, limits } = input;
  const n = radial.length;
  if ((limits.cross !== null && cross === null) || (limits.along !== null && along === null)) {
    throw new Error("withinToleranceFlags: cross/along limits need a row bearing");
  }
  const rLim = limits.radial ?? Infinity;
  const cLim = limits.cross ?? Infinity;
  const aLim = limits.along ?? Infinity;
  const flags = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    let ok = radial[i] <= rLim;
    if (ok && cross !== null && limits.cross !== null) ok = Math.abs(cross[i]) <= cLim;
    if (ok && along !== null && limits.along !== null) ok = Math.abs(along[i]) <= aLim;
    flags[i] = ok ? 1 : 0;
  }
  return flags;
}

/**
 * Share within tolerance with an exact two-sided Clopper–Pearson interval and the one-sided exact lower bound at
 * `confidence`.
 *
 * Source: Clopper & Pearson, Biometrika 26 (1934) 404–413; one-sided form in trust.ts.
 *
 * @example withinToleranceShare(Uint8Array.of(1, 1, 0, 1), 0.95, limits) // { share: 0.75, within: 3, n: 4, ... }
 */
export function withinToleranceShare(flags: Uint8Array, confidence: number, limits: ToleranceLimits): WithinTolerance {
  let within = 0;
  for (let i = 0; i < flags.length; i++) within += flags[i];
  const n = flags.length;
  const ci = clopperPearson(within, n, confidence);
  return {
    share: n === 0 ? null : within / n,
    lower95: ci ? ci.lower : null,
    upper95: ci ? ci.upper : null,
    lowerOneSided: oneSidedLowerBound(within, n, confidence),
    within,
    n,
    confidence,
    limits: { ...limits },
  };
}
