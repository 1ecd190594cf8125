/**
 * Standard normal distribution function Φ, from the complementary error function.
 */

/**
 * Complementary error function erfc(x) by the Chebyshev fit of Numerical Recipes (fractional error below 1.2e-7
 * for every x), so small tails keep their relative precision.
 *
 * Source: Press, Teukolsky, Vetterling & Flannery, Numerical Recipes in C, 2nd ed. (1992), §6.2, function erfcc.
 *
 * @example erfc(0) // 1
 */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return Number.NaN;
  const z = Math.abs(x);
  const t = 1 / (1 + 0.5 * z);
  const ans =
    t *
    Math.exp(
      -z * z -
        1.26551223 +
        t *
          (1.00002368 +
            t *
              (0.37409196 +
                t *
                  (0.09678418 +
                    t *
                      (-0.18628806 +
                        t *
                          (0.27886807 + t * (-1.13520398 + t * (1.48851587 + t * (-0.82215223 + t * 0.17087277)))))))),
    );
  return x >= 0 ? ans : 2 - ans;
}

/**
 * Standard normal distribution function Φ(z) = ½·erfc(−z/√2).
 *
 * Source: Abramowitz & Stegun (1964) 26.2.29; erfc as in {@link erfc}.
 *
 * @example normalCdf(1.959964) // 0.975
 */
export function normalCdf(z: number): number {
  if (z === Infinity) return 1;
  if (z === -Infinity) return 0;
  return 0.5 * erfc(-z / Math.SQRT2);
}
