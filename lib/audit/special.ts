/**
 * Special functions behind the audit's confidence intervals: log-gamma, the regularised
 * incomplete beta function and its inverse. Pure, no dependencies.
 */

// Lanczos approximation, g = 7, 9 coefficients (Godfrey's set); relative error about 1e-15 for x > 0.
const LANCZOS_G = 7;
const LANCZOS_COEFFICIENTS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];
const HALF_LOG_TWO_PI = 0.5 * Math.log(2 * Math.PI);

/**
 * Natural logarithm of the gamma function, ln Γ(x), for x > 0.
 *
 * Source: Lanczos, "A precision approximation of the gamma function", SIAM J. Numer. Anal. B 1 (1964) 86–96,
 * with g = 7 and Godfrey's nine coefficients; the reflection formula covers 0 < x < 0.5.
 *
 * @example logGamma(5) // ln(4!) = ln 24 ≈ 3.1780538
 */
export function logGamma(x: number): number {
  if (!(x > 0)) throw new Error(`logGamma: x must be > 0, got ${x}`);
  if (x < 0.5) {
    // Γ(x)Γ(1−x) = π / sin(πx)
    return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  }
  const z = x - 1;
  let sum = LANCZOS_COEFFICIENTS[0];
  for (let i = 1; i < LANCZOS_COEFFICIENTS.length; i++) sum += LANCZOS_COEFFICIENTS[i] / (z + i);
  const t = z + LANCZOS_G + 0.5;
  return HALF_LOG_TWO_PI + (z + 0.5) * Math.log(t) - t + Math.log(sum);
}

/**
 * ln B(a, b) = ln Γ(a) + ln Γ(b) − ln Γ(a + b), for a, b > 0.
 *
 * @example logBeta(1, 1) // 0
 */
export function logBeta(a: number, b: number): number {
  return logGamma(a) + logGamma(b) - logGamma(a + b);
}

const CF_EPSILON = 1e-16;
const CF_TINY = 1e-300;
const CF_MAX_ITERATIONS = 100_000;

/** Continued fraction of I_x(a, b) (Abramowitz & Stegun 26.5.8), evaluated by the modified Lentz method. */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const qab = a + b;
  const qap = a + 1;
  const qam = a - 1;
  let c = 1;
  let d = 1 - (qab * x) / qap;
  if (Math.abs(d) < CF_TINY) d = CF_TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= CF_MAX_ITERATIONS; m++) {
    const m2 = 2 * m;
    // even step: d_{2m} = m(b − m)x / ((a + 2m − 1)(a + 2m))
    let aa = (m * (b - m) * x) / ((qam + m2) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    h *= d * c;
    // odd step: d_{2m+1} = −(a + m)(a + b + m)x / ((a + 2m)(a + 2m + 1))
    aa = (-(a + m) * (qab + m) * x) / ((a + m2) * (qap + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < CF_TINY) d = CF_TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < CF_TINY) c = CF_TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < CF_EPSILON) return h;
  }
  throw new Error(`regIncBeta: continued fraction did not converge for x=${x}, a=${a}, b=${b}`);
}

/**
 * Regularised incomplete beta function I_x(a, b) = B(x; a, b) / B(a, b), the CDF of Beta(a, b) at x.
 *
 * Source: Abramowitz & Stegun, Handbook of Mathematical Functions (1964), 26.5.8 (continued fraction)
 * and 26.5.2 (symmetry I_x(a, b) = 1 − I_{1−x}(b, a), used when x > (a + 1)/(a + b + 2) so the fraction converges fast).
 *
 * @example regIncBeta(0.5, 2, 2) // 0.5
 */
export function regIncBeta(x: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new Error(`regIncBeta: a and b must be > 0, got a=${a}, b=${b}`);
  if (Number.isNaN(x)) return Number.NaN;
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const logFront = a * Math.log(x) + b * Math.log1p(-x) - logBeta(a, b);
  if (x < (a + 1) / (a + b + 2)) {
    return (Math.exp(logFront) * betaContinuedFraction(x, a, b)) / a;
  }
  return 1 - (Math.exp(logFront) * betaContinuedFraction(1 - x, b, a)) / b;
}

/** Beta(a, b) density at x, from logs so large a, b do not overflow. */
function betaDensity(x: number, a: number, b: number, lnB: number): number {
  return Math.exp((a - 1) * Math.log(x) + (b - 1) * Math.log1p(-x) - lnB);
}

/**
 * Inverse of the regularised incomplete beta function: the x in [0, 1] with I_x(a, b) = p
 * (the p-quantile of the Beta(a, b) distribution).
 *
 * Method: Newton's iteration on I_x(a, b) − p, safeguarded by bisection inside a bracket that always
 * holds the root, so it converges for every a, b > 0 and p in [0, 1]. Starts from the Beta mean.
 *
 * @example invRegIncBeta(0.5, 2, 2) // 0.5
 * @example invRegIncBeta(0.975, 1, 20) // 1 − 0.025^(1/20) ≈ 0.16843
 */
export function invRegIncBeta(p: number, a: number, b: number): number {
  if (!(a > 0) || !(b > 0)) throw new Error(`invRegIncBeta: a and b must be > 0, got a=${a}, b=${b}`);
  if (!(p >= 0 && p <= 1)) throw new Error(`invRegIncBeta: p must be in [0, 1], got ${p}`);
  if (p === 0) return 0;
  if (p === 1) return 1;
  const lnB = logBeta(a, b);
  let lo = 0;
  let hi = 1;
  let x = a / (a + b);
  for (let iteration = 0; iteration < 2200; iteration++) {
    const f = regIncBeta(x, a, b) - p;
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const density = betaDensity(x, a, b, lnB);
    let next = density > 0 && Number.isFinite(density) ? x - f / density : Number.NaN;
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    if (next === x || next === lo || next === hi) return x; // no representable progress left: x is within an ulp or two
    x = next;
  }
  return x;
}
