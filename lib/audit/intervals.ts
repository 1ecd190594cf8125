/**
 * Confidence intervals: Student t (for bias) and exact Clopper–Pearson (for the share within tolerance).
 */
import { invRegIncBeta, regIncBeta } from "./special";

/** A closed interval [lower, upper] in the unit of the estimate (metres for bias, a share for proportions). */
export interface Interval {
  lower: number;
  upper: number;
}

function assertProbability(name: string, p: number, open = true): void {
  const ok = open ? p > 0 && p < 1 : p >= 0 && p <= 1;
  if (!ok) throw new Error(`${name}: probability must be in ${open ? "(0, 1)" : "[0, 1]"}, got ${p}`);
}

/**
 * Student t cumulative distribution P(T ≤ t) with `df` degrees of freedom (df > 0, need not be an integer).
 *
 * Source: Abramowitz & Stegun (1964) 26.7.1 with 26.5.27: for t ≥ 0, P(T ≤ t) = 1 − ½·I_x(df/2, ½), x = df/(df + t²).
 *
 * @example studentTCdf(0, 5) // 0.5
 */
export function studentTCdf(t: number, df: number): number {
  if (!(df > 0)) throw new Error(`studentTCdf: df must be > 0, got ${df}`);
  if (Number.isNaN(t)) return Number.NaN;
  if (t === Infinity) return 1;
  if (t === -Infinity) return 0;
  const t2 = t * t;
  // Use whichever of x = df/(df+t²) or 1 − x is small, so the tail keeps its precision.
  const tail =
    t2 < df ? 0.5 * (1 - regIncBeta(t2 / (df + t2), 0.5, df / 2)) : 0.5 * regIncBeta(df / (df + t2), df / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Student t quantile: the t with P(T ≤ t) = p, for `df` > 0 degrees of freedom.
 *
 * Source: inverts the relation in {@link studentTCdf} (Abramowitz & Stegun 26.7.1, 26.5.27) through the inverse
 * regularised incomplete beta function; solved for x = df/(df + t²) in the far tails and for 1 − x near the centre.
 *
 * @example studentTQuantile(0.975, 10) // ≈ 2.228139
 */
export function studentTQuantile(p: number, df: number): number {
  assertProbability("studentTQuantile", p);
  if (!(df > 0)) throw new Error(`studentTQuantile: df must be > 0, got ${df}`);
  if (p === 0.5) return 0;
  const tail = Math.min(p, 1 - p); // one-sided tail probability
  let t: number;
  if (2 * tail < 0.5) {
    // Far tail: I_x(df/2, ½) = 2·tail, t² = df(1 − x)/x.
    const x = invRegIncBeta(2 * tail, df / 2, 0.5);
    t = Math.sqrt((df * (1 - x)) / x);
  } else {
    // Near the centre: I_y(½, df/2) = 1 − 2·tail with y = 1 − x = t²/(df + t²), t² = df·y/(1 − y).
    const y = invRegIncBeta(1 - 2 * tail, 0.5, df / 2);
    t = Math.sqrt((df * y) / (1 - y));
  }
  return p > 0.5 ? t : -t;
}

/**
 * Two-sided t-based confidence interval for a mean: mean ± t_{(1+c)/2, n−1} · sd/√n.
 * Returns null for n < 2 (no sample standard deviation). Unit: that of `mean` and `sd` (metres here).
 *
 * Source: Student, "The probable error of a mean", Biometrika 6 (1908) 1–25; the usual textbook form.
 *
 * @example meanConfidenceInterval(0.01, 0.02, 25, 0.95) // { lower: 0.01 − 2.0639·0.004, upper: 0.01 + 2.0639·0.004 }
 */
export function meanConfidenceInterval(mean: number, sd: number, n: number, confidence: number): Interval | null {
  assertProbability("meanConfidenceInterval", confidence);
  if (n < 2 || !Number.isFinite(mean) || !Number.isFinite(sd)) return null;
  const halfWidth = (studentTQuantile((1 + confidence) / 2, n - 1) * sd) / Math.sqrt(n);
  return { lower: mean - halfWidth, upper: mean + halfWidth };
}

/**
 * Exact (Clopper–Pearson) two-sided confidence interval for a binomial share k/n, e.g. the share of
 * plants within tolerance. lower = Beta⁻¹(α/2; k, n − k + 1) (0 when k = 0),
 * upper = Beta⁻¹(1 − α/2; k + 1, n − k) (1 when k = n), α = 1 − confidence. Returns null when n = 0.
 *
 * Source: Clopper & Pearson, Biometrika 26 (1934) 404–413; checked against Newcombe, Stat Med 17:857–872 (1998), Table I.
 *
 * @example clopperPearson(81, 263, 0.95) // { lower: 0.2527…, upper: 0.3676… }
 */
export function clopperPearson(k: number, n: number, confidence: number): Interval | null {
  assertProbability("clopperPearson", confidence);
  if (!Number.isInteger(k) || !Number.isInteger(n) || k < 0 || n < 0 || k > n) {
    throw new Error(`clopperPearson: need integers 0 ≤ k ≤ n, got k=${k}, n=${n}`);
  }
  if (n === 0) return null;
  const alpha = 1 - confidence;
  const lower = k === 0 ? 0 : invRegIncBeta(alpha / 2, k, n - k + 1);
  const upper = k === n ? 1 : invRegIncBeta(1 - alpha / 2, k + 1, n - k);
  return { lower, upper };
}
