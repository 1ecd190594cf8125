/**
 * NSSDA horizontal accuracy at 95 % confidence (FGDC-STD-007.3-1998, Geospatial Positioning Accuracy
 * Standards Part 3: National Standard for Spatial Data Accuracy, Appendix 3-A), with the standard's condition
 * for when its formula applies. Metres.
 */

/** Multiplier of RMSE_x for Case 1, as printed in the standard (= sqrt(−2 ln 0.05) to 4 decimals). */
export const NSSDA_CASE1_FACTOR_X = 2.4477;
/** Multiplier of RMSE_r for Case 1, as printed in the standard (= 2.4477/√2 to 4 decimals). */
export const NSSDA_CASE1_FACTOR_R = 1.7308;
/** Lower bound (exclusive) of RMSE_min/RMSE_max for the Case 2 approximation. */
export const NSSDA_CASE2_MIN_RATIO = 0.6;
/** FGDC-STD-007.3-1998 §3.2.2: at least 20 checkpoints. */
export const NSSDA_MIN_CHECKPOINTS = 20;

/** Which formula of the standard was used. */
export type NssdaCase = "case1" | "case2" | "not-applicable";

/** NSSDA horizontal accuracy at 95 % confidence. */
export interface NssdaResult {
  /** Accuracy_r (95 %), metres; for "not-applicable" the empirical 95th percentile of radial errors instead. */
  value: number;
  case: NssdaCase;
  /** Plain-language statement of the rule applied. */
  note: string;
}

/**
 * NSSDA horizontal accuracy at 95 % confidence from the component RMSEs (metres).
 * - Case 1, RMSE_E = RMSE_N: Accuracy_r = 1.7308·RMSE_r (= 2.4477·RMSE_E).
 * - Case 2, 0.6 < RMSE_min/RMSE_max < 1: Accuracy_r ≈ 2.4477·0.5·(RMSE_E + RMSE_N).
 * - Otherwise the standard's formula does not apply: the value is `empiricalR95` (the 95th percentile of the radial
 *   errors) and the note says so. At ratio 0.6 the Case 2 formula already underestimates the true 95 % radius by about 6 %.
 * A note is added when fewer than 20 checkpoints were used (§3.2.2).
 *
 * Source: FGDC-STD-007.3-1998, Appendix 3-A (formulas), §3.2.2 (minimum checkpoints).
 *
 * @example nssdaHorizontal(0.01, 0.01, 0.024, 30) // { value: 0.024477, case: "case1", ... }
 */
export function nssdaHorizontal(rmseE: number, rmseN: number, empiricalR95: number, checkpoints: number): NssdaResult {
  if (!(rmseE >= 0) || !(rmseN >= 0)) throw new Error(`nssdaHorizontal: RMSEs must be ≥ 0, got ${rmseE}, ${rmseN}`);
  const lo = Math.min(rmseE, rmseN);
  const hi = Math.max(rmseE, rmseN);
  const ratio = hi === 0 ? 1 : lo / hi;
  const few =
    checkpoints < NSSDA_MIN_CHECKPOINTS
      ? ` Only ${checkpoints} checkpoint${checkpoints === 1 ? "" : "s"}; the standard asks for at least ${NSSDA_MIN_CHECKPOINTS}.`
      : "";
  if (ratio === 1) {
    return {
      value: NSSDA_CASE1_FACTOR_R * Math.hypot(rmseE, rmseN),
      case: "case1",
      note: `Case 1 (RMSE_E = RMSE_N): Accuracy_r = 1.7308 × RMSE_r.${few}`,
    };
  }
  const ratioText = ratio.toFixed(3);
  if (ratio > NSSDA_CASE2_MIN_RATIO) {
    return {
      value: NSSDA_CASE1_FACTOR_X * 0.5 * (rmseE + rmseN),
      case: "case2",
      note: `Case 2 (RMSE_min/RMSE_max = ${ratioText}, between 0.6 and 1): Accuracy_r ≈ 2.4477 × 0.5 × (RMSE_E + RMSE_N).${few}`,
    };
  }
  return {
    value: empiricalR95,
    case: "not-applicable",
    note:
      `RMSE_min/RMSE_max = ${ratioText} is not above 0.6, so the NSSDA formula does not apply; ` +
      `the value is the empirical 95th percentile of the radial errors.${few}`,
  };
}
