/**
 * Moments of error components: mean (bias), sample standard deviation, RMSE, horizontal RMSE.
 * All inputs and outputs in metres. Inputs are read, never modified.
 */

/**
 * Arithmetic mean; NaN when empty. Two passes (mean, then the mean of the remainders) for accuracy on large n.
 *
 * @example mean(Float64Array.of(0.01, 0.03)) // 0.02
 */
export function mean(values: ArrayLike<number>): number {
  const n = values.length;
  if (n === 0) return Number.NaN;
  let sum = 0;
  for (let i = 0; i < n; i++) sum += values[i];
  const first = sum / n;
  let correction = 0;
  for (let i = 0; i < n; i++) correction += values[i] - first;
  return first + correction / n;
}

/**
 * Sample standard deviation with the n − 1 divisor: sqrt(Σ(x − x̄)² / (n − 1)); NaN when n < 2.
 * Two-pass form (corrected two-pass algorithm, Chan, Golub & LeVeque, The American Statistician 37 (1983) 242–247).
 *
 * @example sampleSd(Float64Array.of(1, 2, 3, 4)) // 1.2909944
 */
export function sampleSd(values: ArrayLike<number>, knownMean?: number): number {
  const n = values.length;
  if (n < 2) return Number.NaN;
  const m = knownMean ?? mean(values);
  let ss = 0;
  let s = 0;
  for (let i = 0; i < n; i++) {
    const d = values[i] - m;
    ss += d * d;
    s += d;
  }
  return Math.sqrt(Math.max(0, (ss - (s * s) / n) / (n - 1)));
}

/**
 * Root-mean-square error of one component: sqrt(Σ d² / n), with d = survey − planted; NaN when empty.
 *
 * Source: FGDC-STD-007.3-1998 (NSSDA), Appendix 3-A: RMSE_x = sqrt(Σ(x_data − x_check)² / n).
 *
 * @example rmse(Float64Array.of(0.03, -0.04)) // sqrt((0.0009 + 0.0016)/2) ≈ 0.035355
 */
export function rmse(errors: ArrayLike<number>): number {
  const n = errors.length;
  if (n === 0) return Number.NaN;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = errors[i];
    ss += d * d;
  }
  return Math.sqrt(ss / n);
}

/**
 * Horizontal (radial) RMSE from the two component RMSEs: RMSE_r = sqrt(RMSE_E² + RMSE_N²), metres.
 *
 * Source: FGDC-STD-007.3-1998 (NSSDA), Appendix 3-A.
 *
 * @example rmseRadial(0.03, 0.04) // 0.05
 */
export function rmseRadial(rmseE: number, rmseN: number): number {
  return Math.hypot(rmseE, rmseN);
}
