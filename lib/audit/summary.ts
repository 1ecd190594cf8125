/**
 * Headline statistics of one set of paired errors (corrected or raw positions). Metres.
 */
import { meanConfidenceInterval } from "./intervals";
import { nssdaHorizontal } from "./nssda";
import { quantilesInPlace } from "./quantiles";
import { modelRadii } from "./radii";
import { mean, rmse, rmseRadial, sampleSd } from "./rmse";
import { hasLimits, withinToleranceShare, type ToleranceLimits } from "./tolerance";
import type { ErrorColumns } from "./error-columns";
import type { HeadlineStats } from "./types";

/**
 * Finite number or null, so a summary never holds NaN.
 *
 * @example finiteOrNull(Number.NaN) // null
 */
export function finiteOrNull(x: number): number | null {
  return Number.isFinite(x) ? x : null;
}

export type { ErrorColumns } from "./error-columns";

/**
 * Headline statistics: bias with t-intervals, sample SDs (n − 1), RMSE_E/N/r, empirical and circular-normal CEP/R95,
 * NSSDA 95 %, along/cross components and the share within tolerance. Nulls (never NaN) where a statistic is undefined:
 * everything but `pairs` for 0 pairs; SDs and intervals for 1 pair. Inputs are not modified; `scratch` (length ≥ n),
 * when given, is used as work space for the percentiles and overwritten.
 *
 * Source: FGDC-STD-007.3-1998 Appendix 3-A (RMSE, RMSE_r, NSSDA); Hyndman & Fan 1996 type 7 (percentiles);
 * Student 1908 (t-interval); Clopper & Pearson 1934 (share within tolerance).
 *
 * @example headlineStatistics(columns, { radial: 0.03, cross: null, along: null }, 0.95).rmseR
 */
export function headlineStatistics(
  columns: ErrorColumns,
  limits: ToleranceLimits,
  confidence: number,
  scratch?: Float64Array,
): HeadlineStats {
  const { dE, dN, along, cross, radial, within } = columns;
  const n = dE.length;
  const withinTolerance = within && hasLimits(limits) ? withinToleranceShare(within, confidence, limits) : null;
  if (n === 0) {
    return {
      pairs: 0,
      meanDE: null,
      meanDN: null,
      meanDECi: null,
      meanDNCi: null,
      sdDE: null,
      sdDN: null,
      rmseE: null,
      rmseN: null,
      rmseR: null,
      cep50: null,
      r95: null,
      cep50Model: null,
      r95Model: null,
      nssda95: null,
      nssdaCase: null,
      nssdaNote: null,
      meanAlong: null,
      meanCross: null,
      rmseAlong: null,
      rmseCross: null,
      sdAlong: null,
      sdCross: null,
      withinTolerance,
    };
  }
  const meanDE = mean(dE);
  const meanDN = mean(dN);
  const sdDE = sampleSd(dE, meanDE);
  const sdDN = sampleSd(dN, meanDN);
  const rmseE = rmse(dE);
  const rmseN = rmse(dN);
  const work = scratch && scratch.length >= n ? scratch.subarray(0, n) : new Float64Array(n);
  work.set(radial);
  const [cep50, r95] = quantilesInPlace(work, [0.5, 0.95]);
  const model = modelRadii(rmseE, rmseN);
  const nssda = nssdaHorizontal(rmseE, rmseN, r95, n);
  const meanAlong = along ? mean(along) : Number.NaN;
  const meanCross = cross ? mean(cross) : Number.NaN;
  return {
    pairs: n,
    meanDE,
    meanDN,
    meanDECi: meanConfidenceInterval(meanDE, sdDE, n, confidence),
    meanDNCi: meanConfidenceInterval(meanDN, sdDN, n, confidence),
    sdDE: finiteOrNull(sdDE),
    sdDN: finiteOrNull(sdDN),
    rmseE,
    rmseN,
    rmseR: rmseRadial(rmseE, rmseN),
    cep50,
    r95,
    cep50Model: model.cep50,
    r95Model: model.r95,
    nssda95: nssda.value,
    nssdaCase: nssda.case,
    nssdaNote: nssda.note,
    meanAlong: finiteOrNull(meanAlong),
    meanCross: finiteOrNull(meanCross),
    rmseAlong: along ? rmse(along) : null,
    rmseCross: cross ? rmse(cross) : null,
    sdAlong: along ? finiteOrNull(sampleSd(along, meanAlong)) : null,
    sdCross: cross ? finiteOrNull(sampleSd(cross, meanCross)) : null,
    withinTolerance,
  };
}
