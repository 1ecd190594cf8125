/**
 * Welch's unequal-variance t-test of two means, from their summaries.
 */
import { studentTCdf } from "../intervals";

/** A two-sample comparison of means. */
export interface WelchResult {
  /** Difference b − a of the means. */
  difference: number;
  /** t statistic (b − a)/√(s_a²/n_a + s_b²/n_b). */
  t: number;
  /** Welch–Satterthwaite degrees of freedom. */
  df: number;
  /** Two-sided p-value. */
  p: number;
}

/** Summary of one sample. */
export interface SampleSummary {
  n: number;
  mean: number;
  /** Sample SD (n − 1). */
  sd: number;
}

/**
 * Welch's t-test of the difference of two means b − a: t = (m_b − m_a)/√(v_a + v_b), v = s²/n, with the
 * Welch–Satterthwaite degrees of freedom df = (v_a + v_b)² / (v_a²/(n_a − 1) + v_b²/(n_b − 1)) and a two-sided
 * p-value from Student's t. Null when either sample has fewer than 2 values or both variances are 0.
 *
 * Source: Welch, "The generalization of 'Student's' problem when several different population variances are
 * involved", Biometrika 34 (1947) 28–35; Satterthwaite, Biometrics Bulletin 2 (1946) 110–114.
 *
 * @example welchTest({ n: 10, mean: 0, sd: 1 }, { n: 10, mean: 1, sd: 1 }) // { t: 2.236, df: 18, p: 0.038 }
 */
export function welchTest(a: SampleSummary, b: SampleSummary): WelchResult | null {
  if (a.n < 2 || b.n < 2) return null;
  const va = (a.sd * a.sd) / a.n;
  const vb = (b.sd * b.sd) / b.n;
  const v = va + vb;
  if (!(v > 0)) return null;
  const difference = b.mean - a.mean;
  const t = difference / Math.sqrt(v);
  const df = (v * v) / ((va * va) / (a.n - 1) + (vb * vb) / (b.n - 1));
  return { difference, t, df, p: 2 * studentTCdf(-Math.abs(t), df) };
}
