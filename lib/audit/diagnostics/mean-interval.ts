/**
 * A mean with its Student t interval and a two-sided test of "mean = 0".
 */
import { studentTCdf, studentTQuantile } from "../intervals";
import { mean as meanOf, sampleSd } from "../rmse";

/** A sample mean with its t interval. Unit of the values (metres here). */
export interface MeanInterval {
  /** Number of values. */
  n: number;
  /** Sample mean; null when n = 0. */
  mean: number | null;
  /** Sample SD (n − 1); null when n < 2. */
  sd: number | null;
  /** Standard error sd/√n; null when n < 2. */
  se: number | null;
  /** Half width t_{(1+c)/2, n−1}·se; null when n < 2. */
  halfWidth: number | null;
  lower: number | null;
  upper: number | null;
  /** Two-sided p-value of the one-sample t-test of mean = 0; null when n < 2 or sd = 0. */
  p: number | null;
  /** True when the interval excludes 0 (the p-value is below 1 − confidence). */
  significant: boolean;
}

/**
 * Mean, standard error and two-sided t interval mean ± t_{(1+c)/2, n−1}·s/√n, with the one-sample t-test of
 * mean = 0 (t = mean/se, df = n − 1). Values are read, not modified.
 *
 * Source: Student, "The probable error of a mean", Biometrika 6 (1908) 1–25; NIST/SEMATECH e-Handbook of
 * Statistical Methods §1.3.5.2 (confidence limits for the mean) and §1.3.5.3 (one-sample t-test).
 *
 * @example meanInterval([0.001, 0.003], 0.95) // { n: 2, mean: 0.002, halfWidth: 12.706·0.001, ... }
 */
export function meanInterval(values: ArrayLike<number>, confidence = 0.95): MeanInterval {
  if (!(confidence > 0 && confidence < 1))
    throw new Error(`meanInterval: confidence must be in (0, 1), got ${confidence}`);
  const n = values.length;
  if (n === 0)
    return {
      n,
      mean: null,
      sd: null,
      se: null,
      halfWidth: null,
      lower: null,
      upper: null,
      p: null,
      significant: false,
    };
  const m = meanOf(values);
  if (n < 2)
    return { n, mean: m, sd: null, se: null, halfWidth: null, lower: null, upper: null, p: null, significant: false };
  const sd = sampleSd(values, m);
  const se = sd / Math.sqrt(n);
  const halfWidth = studentTQuantile((1 + confidence) / 2, n - 1) * se;
  const p = se > 0 ? 2 * studentTCdf(-Math.abs(m / se), n - 1) : null;
  return {
    n,
    mean: m,
    sd,
    se,
    halfWidth,
    lower: m - halfWidth,
    upper: m + halfWidth,
    p,
    significant: se > 0 ? Math.abs(m) > halfWidth : m !== 0,
  };
}
