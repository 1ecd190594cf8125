/**
 * Accuracy statements in the standards' own form, from the audit's component RMSEs. Pure; metres.
 *
 * - NSSDA (FGDC-STD-007.3-1998 §3.2.3, formulas in Appendix 3-A): "Tested __ (meters) horizontal accuracy at
 *   95% confidence level", with Accuracy_r from nssdaHorizontal (Case 1 / Case 2; no statement when the formula
 *   does not apply).
 * - ASPRS Positional Accuracy Standards for Digital Geospatial Data, Edition 2 (2023): horizontal accuracy is
 *   reported as RMSE_H (no 95 % figure), and the checkpoint survey's own error is included as
 *   RMSE_H = sqrt(RMSE_H1² + RMSE_H2²), RMSE_H1 measured against the checkpoints, RMSE_H2 the checkpoint survey's
 *   own RMSE (from memory: symbol names and formula; section number not checked). Edition 2 asks for at least 30
 *   checkpoints (from the edition's published summary of changes).
 */
import { NSSDA_MIN_CHECKPOINTS, type NssdaCase, nssdaHorizontal } from "./nssda";

/** ASPRS Ed. 2 (2023): minimum number of checkpoints for a product accuracy assessment. */
export const ASPRS_ED2_MIN_CHECKPOINTS = 30;

export interface AccuracyStatementInput {
  /** RMSE of the easting (x) differences, metres. */
  rmseE: number;
  /** RMSE of the northing (y) differences, metres. */
  rmseN: number;
  /** Empirical 95th percentile of the radial errors, metres (used only when the NSSDA formula does not apply). */
  r95: number;
  /** Checkpoints (pairs) used. */
  pairs: number;
  /** The checkpoint survey's own horizontal RMSE, metres; null when unknown. */
  surveyRmseH: number | null;
}

export interface AccuracyStatement {
  nssda: {
    /** Accuracy_r at 95 %, metres; null when the standard's formula does not apply. */
    value: number | null;
    case: NssdaCase;
    sentence: string;
  };
  asprs: {
    /** RMSE_H1: horizontal RMSE measured against the checkpoints, metres. */
    rmseH1: number;
    /** RMSE_H2: the checkpoint survey's own horizontal RMSE, metres; null when unknown. */
    rmseH2: number | null;
    /** RMSE_H reported: sqrt(RMSE_H1² + RMSE_H2²), or RMSE_H1 alone when RMSE_H2 is unknown. */
    rmseH: number;
    surveyAccounted: boolean;
    sentence: string;
  };
}

/** Metres to 4 decimals (0.1 mm), as the statements print them. */
export const metres4 = (m: number) => m.toFixed(4);

/**
 * Both statements, as plain sentences with their numbers.
 *
 * @example accuracyStatement({ rmseE: 0.01, rmseN: 0.01, r95: 0.03, pairs: 30, surveyRmseH: null }).nssda.sentence
 * // "Tested 0.0245 meters horizontal accuracy at 95% confidence level."
 */
export function accuracyStatement(input: AccuracyStatementInput): AccuracyStatement {
  const { rmseE, rmseN, r95, pairs, surveyRmseH } = input;
  const n = nssdaHorizontal(rmseE, rmseN, r95, pairs);
  const fewNssda =
    pairs < NSSDA_MIN_CHECKPOINTS
      ? ` Based on ${pairs} checkpoints; the standard asks for at least ${NSSDA_MIN_CHECKPOINTS}.`
      : "";
  const nssda =
    n.case === "not-applicable"
      ? {
          value: null,
          case: n.case,
          sentence:
            "No NSSDA statement: the x and y RMSEs differ too much (RMSE_min/RMSE_max not above 0.6) for the " +
            `standard's 95% formula to apply.${fewNssda}`,
        }
      : {
          value: n.value,
          case: n.case,
          sentence: `Tested ${metres4(n.value)} meters horizontal accuracy at 95% confidence level.${fewNssda}`,
        };

  const rmseH1 = Math.hypot(rmseE, rmseN);
  const known = surveyRmseH !== null && Number.isFinite(surveyRmseH) && surveyRmseH >= 0;
  const rmseH = known ? Math.hypot(rmseH1, surveyRmseH) : rmseH1;
  const fewAsprs =
    pairs < ASPRS_ED2_MIN_CHECKPOINTS
      ? ` Based on ${pairs} checkpoints; Edition 2 asks for at least ${ASPRS_ED2_MIN_CHECKPOINTS}.`
      : "";
  const sentence = known
    ? `Tested to the ASPRS Positional Accuracy Standards, Edition 2 (2023): RMSE_H = ${metres4(rmseH)} meters ` +
      `horizontal, combining the RMSE measured against the checkpoints (RMSE_H1 = ${metres4(rmseH1)} m) with the ` +
      `checkpoint survey's own RMSE (RMSE_H2 = ${metres4(surveyRmseH)} m).${fewAsprs}`
    : `Tested to the ASPRS Positional Accuracy Standards, Edition 2 (2023): RMSE_H = ${metres4(rmseH)} meters ` +
      `horizontal, measured against the checkpoints; the checkpoint survey's own error was not accounted for ` +
      `(its precision is not known).${fewAsprs}`;
  return {
    nssda,
    asprs: { rmseH1, rmseH2: known ? surveyRmseH : null, rmseH, surveyAccounted: known, sentence },
  };
}
