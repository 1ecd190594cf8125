/**
 * Circular error radii: CEP (50 %) and R95 (95 %), both as empirical percentiles of the radial errors and as
 * values of the circular normal (Rayleigh) model. Metres.
 */
import { quantilesInPlace } from "./quantiles";

/**
 * Radius factor k of the circular normal distribution for probability p: P(r ≤ kσ) = 1 − exp(−k²/2),
 * so k = sqrt(−2·ln(1 − p)).
 *
 * Source: the radial error of a circular bivariate normal with per-axis σ is Rayleigh distributed, whose CDF is
 * 1 − exp(−r²/2σ²) (Lord Rayleigh, Phil. Mag. 10 (1880) 73–78; any probability text).
 *
 * @example circularRadiusFactor(0.5) // 1.177410 = sqrt(2 ln 2)
 * @example circularRadiusFactor(0.95) // 2.447747
 */
export function circularRadiusFactor(p: number): number {
  if (!(p >= 0 && p < 1)) throw new Error(`circularRadiusFactor: p must be in [0, 1), got ${p}`);
  return Math.sqrt(-2 * Math.log1p(-p));
}

/**
 * Probability that a circular normal error falls within k·σ: P = 1 − exp(−k²/2).
 *
 * @example circularProbability(1) // 0.393469
 */
export function circularProbability(k: number): number {
  return -Math.expm1((-k * k) / 2);
}

/** CEP factor, sqrt(2·ln 2) ≈ 1.177410 (P = 0.5). */
export const CEP_FACTOR = circularRadiusFactor(0.5);
/** R95 factor, sqrt(−2·ln 0.05) ≈ 2.447747 (P = 0.95). */
export const R95_FACTOR = circularRadiusFactor(0.95);

/**
 * Per-axis sigma of the circular normal model fitted to the errors: σ_c = sqrt((RMSE_E² + RMSE_N²)/2) = RMSE_r/√2.
 * It uses RMSEs, not standard deviations, so the radii are about the true position (bias included), like the
 * empirical radii. Metres.
 *
 * @example circularSigma(0.03, 0.04) // 0.035355
 */
export function circularSigma(rmseE: number, rmseN: number): number {
  return Math.sqrt((rmseE * rmseE + rmseN * rmseN) / 2);
}

/** Circular error radii, metres. */
export interface Radii {
  /** Radius containing 50 % of the errors. */
  cep50: number;
  /** Radius containing 95 % of the errors. */
  r95: number;
}

/**
 * Circular-normal model radii: CEP = 1.177410·σ_c, R95 = 2.447747·σ_c with σ_c from {@link circularSigma}.
 * Exact only for unbiased errors with equal, uncorrelated component variances; compare with {@link empiricalRadii}.
 *
 * @example modelRadii(0.01, 0.01) // { cep50: 0.0117741, r95: 0.0244775 }
 */
export function modelRadii(rmseE: number, rmseN: number): Radii {
  const sigma = circularSigma(rmseE, rmseN);
  return { cep50: CEP_FACTOR * sigma, r95: R95_FACTOR * sigma };
}

/**
 * Empirical CEP and R95: the 50th and 95th percentiles of the radial errors sqrt(dE² + dN²), Hyndman–Fan type 7
 * (linear interpolation between order statistics, h = (n − 1)·p). `radial` is not modified. NaN when empty.
 *
 * Source: Hyndman & Fan, The American Statistician 50 (1996) 361–365, definition 7.
 *
 * @example empiricalRadii(Float64Array.of(0.01, 0.02, 0.03)) // { cep50: 0.02, r95: 0.029 }
 */
export function empiricalRadii(radial: ArrayLike<number>): Radii {
  const [cep50, r95] = quantilesInPlace(
    radial instanceof Float64Array ? radial.slice() : Float64Array.from(radial),
    [0.5, 0.95],
  );
  return { cep50, r95 };
}
