/**
 * Comparison of two audits' diagnostics: headline and per-arm differences with their significance.
 */
import type { ArmDiagnostics } from "./arm-offsets";
import { type VarianceRatioResult, varianceRatioTest } from "./f-test";
import type { MeanInterval } from "./mean-interval";
import { type WelchResult, welchTest } from "./welch";

/** The headline figures a comparison needs. */
export interface ComparableHeadline {
  pairs: number;
  /** Horizontal RMSE, metres. */
  rmseR: number | null;
}

export interface HeadlineChange {
  before: number | null;
  after: number | null;
  /** after/before − 1. */
  relative: number | null;
  /** F-test of the horizontal mean squares (df 2n each). */
  test: VarianceRatioResult | null;
  significant: boolean;
}

export interface ArmChange {
  arm: string | null;
  component: "cross" | "along";
  /** Change of the mean error (after − before), Welch's t-test. */
  mean: WelchResult | null;
  meanSignificant: boolean;
  /** Change of the spread: F = sd_after²/sd_before². */
  spread: VarianceRatioResult | null;
  spreadSignificant: boolean;
  before: number | null;
  after: number | null;
}

export interface DiagnosticsComparison {
  rmseR: HeadlineChange;
  arms: ArmChange[];
  /** What changed, in one sentence. */
  sentence: string;
  /** The tests used and their sources. */
  methods: string;
}

const METHODS =
  "Means: Welch's t-test (Welch, Biometrika 34 (1947) 28–35). Spreads and horizontal RMSE: two-sided F-test of variances (NIST/SEMATECH e-Handbook §1.3.5.9). Significant at the audit's confidence level.";

function summary(mi: MeanInterval) {
  return mi.mean !== null && mi.sd !== null ? { n: mi.n, mean: mi.mean, sd: mi.sd } : null;
}

const mm = (m: number) => `${(Math.abs(m) * 1000).toFixed(1)} mm`;

/**
 * Compares a later audit's diagnostics (`after`) with an earlier one (`before`): horizontal RMSE with a two-sided
 * F-test of Σ(dE² + dN²)/2n (df 2n each, errors about zero), and per arm and row component the mean (Welch's t-test)
 * and the spread (F-test of sample variances, df n − 1), significant when p < 1 − confidence. Arms present in both.
 *
 * Source: Welch, Biometrika 34 (1947) 28–35; NIST/SEMATECH e-Handbook of Statistical Methods §1.3.5.9.
 *
 * @example compareDiagnostics(prev, curr).sentence // "Horizontal RMSE fell 41 % (significant); arm 3 moved 2.8 mm across the row (significant)."
 */
export function compareDiagnostics(
  before: { headline: ComparableHeadline; arms: ArmDiagnostics[] },
  after: { headline: ComparableHeadline; arms: ArmDiagnostics[] },
  confidence = 0.95,
): DiagnosticsComparison {
  const alpha = 1 - confidence;
  const b = before.headline;
  const a = after.headline;
  const test =
    b.rmseR !== null && a.rmseR !== null
      ? varianceRatioTest(b.rmseR ** 2 / 2, 2 * b.pairs, a.rmseR ** 2 / 2, 2 * a.pairs)
      : null;
  const rmseR: HeadlineChange = {
    before: b.rmseR,
    after: a.rmseR,
    relative: b.rmseR && a.rmseR !== null ? a.rmseR / b.rmseR - 1 : null,
    test,
    significant: test !== null && test.p < alpha,
  };
  const arms: ArmChange[] = [];
  for (const arm of after.arms) {
    const prev = before.arms.find((x) => x.arm === arm.arm);
    if (!prev) continue;
    for (const component of ["cross", "along"] as const) {
      const sb = summary(prev[component]);
      const sa = summary(arm[component]);
      const mean = sb && sa ? welchTest(sb, sa) : null;
      const spread = sb && sa ? varianceRatioTest(sb.sd ** 2, sb.n - 1, sa.sd ** 2, sa.n - 1) : null;
      arms.push({
        arm: arm.arm,
        component,
        mean,
        meanSignificant: mean !== null && mean.p < alpha,
        spread,
        spreadSignificant: spread !== null && spread.p < alpha,
        before: prev[component].mean,
        after: arm[component].mean,
      });
    }
  }
  const parts: string[] = [];
  if (rmseR.relative !== null)
    parts.push(
      `horizontal RMSE ${rmseR.relative >= 0 ? "rose" : "fell"} ${Math.abs(rmseR.relative * 100).toFixed(0)} %${rmseR.significant ? " (significant)" : " (within chance)"}`,
    );
  for (const c of arms)
    if (c.meanSignificant && c.mean)
      parts.push(
        `arm ${c.arm ?? "(none)"} moved ${mm(c.mean.difference)} ${c.component === "cross" ? (c.mean.difference > 0 ? "to the right" : "to the left") : c.mean.difference > 0 ? "forward" : "back"}`,
      );
  const spreadArms = arms.filter((c) => c.spreadSignificant && c.spread);
  for (const c of spreadArms)
    parts.push(`arm ${c.arm ?? "(none)"} ${c.component}-row spread ${c.spread!.ratio > 1 ? "grew" : "shrank"}`);
  const sentence = parts.length
    ? `${parts[0][0].toUpperCase()}${parts.join("; ").slice(1)}.`
    : "Nothing to compare: too few checkpoints.";
  return { rmseR, arms, sentence, methods: METHODS };
}
