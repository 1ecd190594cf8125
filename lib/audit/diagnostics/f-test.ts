/**
 * The F-test of two variances.
 */
import { regIncBeta } from "../special";

/**
 * Cumulative distribution of Snedecor's F with d1, d2 degrees of freedom: P(F ≤ x) = I_{d1·x/(d1·x + d2)}(d1/2, d2/2).
 *
 * Source: Abramowitz & Stegun (1964) 26.6.2 with 26.5.2.
 *
 * @example fCdf(1, 10, 10) // 0.5
 */
export function fCdf(x: number, d1: number, d2: number): number {
  if (!(d1 > 0) || !(d2 > 0)) throw new Error(`fCdf: degrees of freedom must be > 0, got ${d1}, ${d2}`);
  if (Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 0;
  if (x === Infinity) return 1;
  return regIncBeta((d1 * x) / (d1 * x + d2), d1 / 2, d2 / 2);
}

/** A comparison of two variances. */
export interface VarianceRatioResult {
  /** F = s_b² / s_a² (the later over the earlier). */
  ratio: number;
  df1: number;
  df2: number;
  /** Two-sided p-value, 2·min(P(F ≤ ratio), P(F ≥ ratio)). */
  p: number;
}

/**
 * Two-sided F-test of equal variances: F = s_b²/s_a² with (d_b, d_a) degrees of freedom. Degrees of freedom are
 * n − 1 for a sample SD, or 2n for a horizontal mean square about a known zero (Σ(dE² + dN²) of n pairs).
 * Null when a variance is 0 or a df is not positive. Sensitive to non-normal errors (as every F-test).
 *
 * Source: NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.9 (F-test for equality of two variances).
 *
 * @example varianceRatioTest(1, 20, 2, 20) // { ratio: 2, p: 0.13 }
 */
export function varianceRatioTest(varA: number, dfA: number, varB: number, dfB: number): VarianceRatioResult | null {
  if (!(varA > 0) || !(varB > 0) || !(dfA > 0) || !(dfB > 0)) return null;
  const ratio = varB / varA;
  const lowerTail = fCdf(ratio, dfB, dfA);
  return { ratio, df1: dfB, df2: dfA, p: Math.min(1, 2 * Math.min(lowerTail, 1 - lowerTail)) };
}
