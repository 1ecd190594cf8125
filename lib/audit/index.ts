/**
 * Audit engine, part B: accuracy statistics and reports from projected, paired planted and survey tables.
 * Pure: no I/O, no clock, no environment; inputs are never modified. Errors are SURVEY minus PLANTED, metres.
 */
import { ENGINE_VERSION } from "./engine-version";
import type { AttributeName, CodedColumn, Pairing, ProjectedTable } from "@/geo/types";
import { PAIRED_BY_ID } from "@/geo/types";
import { groupStatistics, type GroupRow } from "./groups";
import { fitSimilarityToErrors } from "./helmert";
import { localDayCodes } from "./local-day";
import { parseAuditOptions, type AuditOptions, type GroupName } from "./options";
import { flagOutliers } from "./outliers";
import { quantilesInPlace } from "./quantiles";
import { rmseRadial } from "./rmse";
import { rowFrame } from "./row-frame";
import { finiteOrNull, headlineStatistics, type ErrorColumns } from "./summary";
import { hasLimits, withinToleranceFlags, type ToleranceLimits } from "./tolerance";
import type { AuditNote, AuditResiduals, AuditResult, AuditSummary, RawSummary, WithoutOutliers } from "./types";

export * from "./types";
export { auditOptionsSchema, outlierRuleSchema, parseAuditOptions, GROUP_NAMES } from "./options";
export type { AuditOptions, ResolvedAuditOptions, GroupName } from "./options";
export { clopperPearson, meanConfidenceInterval, studentTCdf, studentTQuantile } from "./intervals";
export { logGamma, regIncBeta, invRegIncBeta } from "./special";
export { quantileSorted, quantiles, quantilesInPlace, median, medianAbsoluteDeviation } from "./quantiles";
export { mean, sampleSd, rmse, rmseRadial } from "./rmse";
export {
  CEP_FACTOR,
  R95_FACTOR,
  circularProbability,
  circularRadiusFactor,
  circularSigma,
  empiricalRadii,
  modelRadii,
} from "./radii";
export type { Radii } from "./radii";
export { nssdaHorizontal, NSSDA_CASE1_FACTOR_R, NSSDA_CASE1_FACTOR_X, NSSDA_MIN_CHECKPOINTS } from "./nssda";
export type { NssdaResult } from "./nssda";
export { fitSimilarity, fitSimilarityToErrors, applySimilarity } from "./helmert";
export type { SimilarityFit, SimilarityParameters } from "./helmert";
export { flagOutliers, DEFAULT_OUTLIER_RULE, MAD_TO_SD } from "./outliers";
export type { OutlierRule, OutlierResult } from "./outliers";
export { rowFrame, toRowFrame } from "./row-frame";
export { withinToleranceFlags, withinToleranceShare } from "./tolerance";
export { groupStatistics } from "./groups";
export { localDay, localDayCodes, isKnownTimeZone } from "./local-day";
export { headlineStatistics } from "./summary";
export {
  neutraliseCell,
  csvNumberFormatter,
  residualsCsv,
  unpairedCsv,
  summaryCsv,
  summaryRows,
  RESIDUALS_CSV_COLUMNS,
  UNPAIRED_CSV_COLUMNS,
} from "./residuals-csv";

/** Input of {@link computeAudit}. */
export interface AuditInput {
  /** As-planted records, projected to the work CRS (metres). */
  planted: ProjectedTable;
  /** Survey points, projected to the same work CRS. */
  survey: ProjectedTable;
  pairing: Pairing;
  options?: AuditOptions;
}

function checkTable(t: ProjectedTable, name: string): void {
  if (t.x.length !== t.length || t.y.length !== t.length) {
    throw new Error(
      `audit: ${name} table length ${t.length} does not match its coordinate arrays (${t.x.length}, ${t.y.length})`,
    );
  }
}

function checkPairing(p: Pairing, planted: ProjectedTable, survey: ProjectedTable): void {
  const pi = p.plantedIndex;
  const si = p.surveyIndex;
  const n = pi.length;
  if (si.length !== n || p.method.length !== n || p.beyondMaxDistance.length !== n) {
    throw new Error("audit: pairing arrays differ in length");
  }
  const np = planted.length;
  const ns = survey.length;
  for (let i = 0; i < n; i++) {
    const a = pi[i];
    const b = si[i];
    if (a < 0 || a >= np) throw new Error(`audit: pair ${i} refers to planted row ${a}, outside 0..${np - 1}`);
    if (b < 0 || b >= ns) throw new Error(`audit: pair ${i} refers to survey row ${b}, outside 0..${ns - 1}`);
  }
}

function normaliseBearing(deg: number): number {
  const b = ((deg % 360) + 360) % 360;
  return b === 360 ? 0 : b;
}

/** Pair group codes for one grouping, or a greppable error when the data cannot provide it. */
function pairCodes(
  name: GroupName,
  planted: ProjectedTable,
  survey: ProjectedTable,
  pairing: Pairing,
  timeZone: string | undefined,
): { codes: Int32Array; values: string[] } {
  if (name === "day") {
    if (!planted.time) throw new Error(`audit: cannot group by day: ${planted.source} has no planting time column`);
    if (timeZone === undefined) throw new Error('audit: grouping by "day" needs the field\'s time zone');
    return localDayCodes(planted.time, pairing.plantedIndex, timeZone);
  }
  const attr: AttributeName = name;
  let column: CodedColumn | undefined = planted.attrs[attr];
  let rows = pairing.plantedIndex;
  if (!column) {
    column = survey.attrs[attr];
    rows = pairing.surveyIndex;
  }
  if (!column)
    throw new Error(`audit: cannot group by "${attr}": neither ${planted.source} nor ${survey.source} has that column`);
  const codes = new Int32Array(rows.length);
  for (let i = 0; i < rows.length; i++) codes[i] = column.codes[rows[i]];
  return { codes, values: column.values };
}

/** Mean, RMSE and empirical radii of the pairs not flagged as outliers; null without pairs. `scratch` is overwritten. */
function statsWithoutOutliers(
  dE: Float64Array,
  dN: Float64Array,
  radial: Float64Array,
  flags: Uint8Array,
  scratch: Float64Array,
): WithoutOutliers | null {
  const n = dE.length;
  if (n === 0) return null;
  let m = 0;
  let sumE = 0;
  let sumN = 0;
  let sumE2 = 0;
  let sumN2 = 0;
  for (let i = 0; i < n; i++) {
    if (flags[i]) continue;
    const e = dE[i];
    const nn = dN[i];
    sumE += e;
    sumN += nn;
    sumE2 += e * e;
    sumN2 += nn * nn;
    scratch[m++] = radial[i];
  }
  if (m === 0)
    return { pairs: 0, meanDE: null, meanDN: null, rmseE: null, rmseN: null, rmseR: null, cep50: null, r95: null };
  const rmseE = Math.sqrt(sumE2 / m);
  const rmseN = Math.sqrt(sumN2 / m);
  const [cep50, r95] = quantilesInPlace(scratch.subarray(0, m), [0.5, 0.95]);
  return {
    pairs: m,
    meanDE: sumE / m,
    meanDN: sumN / m,
    rmseE,
    rmseN,
    rmseR: rmseRadial(rmseE, rmseN),
    cep50,
    r95,
  };
}

/** Error columns of planted positions (plantedX, plantedY: corrected or raw) against the survey, for all pairs or the pairs listed in `keep`. */
function errorColumns(
  plantedX: Float64Array,
  plantedY: Float64Array,
  survey: ProjectedTable,
  pairing: Pairing,
  bearing: number | null,
  limits: ToleranceLimits,
  keep: Int32Array | null,
): ErrorColumns {
  const pi = pairing.plantedIndex;
  const si = pairing.surveyIndex;
  const sx = survey.x;
  const sy = survey.y;
  const n = keep ? keep.length : pi.length;
  const dE = new Float64Array(n);
  const dN = new Float64Array(n);
  const radial = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    const i = keep === null ? j : keep[j];
    const p = pi[i];
    const s = si[i];
    const e = sx[s] - plantedX[p];
    const nn = sy[s] - plantedY[p];
    if (!Number.isFinite(e) || !Number.isFinite(nn)) {
      throw new Error(`audit: pair ${i} (planted row ${p}, survey row ${s}) has a non-finite coordinate`);
    }
    dE[j] = e;
    dN[j] = nn;
    radial[j] = Math.sqrt(e * e + nn * nn);
  }
  const frame = bearing === null ? null : rowFrame(dE, dN, bearing);
  const along = frame ? frame.along : null;
  const cross = frame ? frame.cross : null;
  const within = hasLimits(limits) ? withinToleranceFlags({ radial, along, cross, limits }) : null;
  return { dE, dN, along, cross, radial, within };
}

/**
 * Computes the accuracy audit of as-planted records against survey points.
 *
 * Errors per pair: dE = survey.x − planted.x, dN = survey.y − planted.y (metres, work CRS); radial = sqrt(dE² + dN²);
 * along/cross for the row bearing (cross positive to the right of the row direction). The summary holds bias with
 * t-intervals, sample SDs, RMSE_E/N/r, CEP/R95 (empirical type-7 percentiles and circular-normal model), NSSDA 95 %,
 * share within tolerance (Clopper–Pearson), outliers (median-MAD rule) and the statistics without them, a Helmert fit
 * planted → survey, breakdowns per attribute or planting day, and the same headline statistics for the raw GNSS
 * positions. Every key is documented in lib/audit/SUMMARY.md. Inputs are not modified.
 *
 * Throws `audit: ...` for invalid options, mismatched CRSs, out-of-range pair indices or non-finite paired coordinates.
 *
 * Source: FGDC-STD-007.3-1998 Appendix 3-A; Hyndman & Fan 1996; Clopper & Pearson 1934; IOGP 373-7-2 (EPSG 9621).
 *
 * @example
 * const { summary, residuals } = computeAudit({ planted, survey, pairing, options: { toleranceRadial: 0.03 } });
 * summary.rmseR; // metres
 */
export function computeAudit(input: AuditInput): AuditResult {
  const { planted, survey, pairing } = input;
  const options = parseAuditOptions(input.options);
  checkTable(planted, "planted");
  checkTable(survey, "survey");
  if (planted.crs !== survey.crs) {
    throw new Error(`audit: planted (${planted.crs}) and survey (${survey.crs}) tables are not in the same work CRS`);
  }
  checkPairing(pairing, planted, survey);
  const n = pairing.plantedIndex.length;
  const bearing = options.rowBearingDeg === undefined ? null : normaliseBearing(options.rowBearingDeg);
  const limits: ToleranceLimits = {
    radial: options.toleranceRadial ?? null,
    cross: options.toleranceCross ?? null,
    along: options.toleranceAlong ?? null,
  };
  const { confidence } = options;

  const columns = errorColumns(planted.x, planted.y, survey, pairing, bearing, limits, null);
  const scratch = new Float64Array(n); // work space for percentiles, reused by every step below
  const headline = headlineStatistics(columns, limits, confidence, scratch);
  const outliers = flagOutliers(columns.dE, columns.dN, options.outlierRule, scratch);
  const withoutOutliers: WithoutOutliers | null =
    n > 0 && outliers.count === 0
      ? {
          pairs: n,
          meanDE: headline.meanDE,
          meanDN: headline.meanDN,
          rmseE: headline.rmseE,
          rmseN: headline.rmseN,
          rmseR: headline.rmseR,
          cep50: headline.cep50,
          r95: headline.r95,
        }
      : statsWithoutOutliers(columns.dE, columns.dN, columns.radial, outliers.flags, scratch);

  // Helmert fit planted → survey, from the planted coordinates and the errors of each pair.
  const helmert = fitSimilarityToErrors(planted.x, planted.y, pairing.plantedIndex, columns.dE, columns.dN);

  // Breakdowns.
  const groups: Partial<Record<GroupName, GroupRow[]>> = {};
  for (const name of options.groupBy) {
    const { codes, values } = pairCodes(name, planted, survey, pairing, options.timeZone);
    groups[name] = groupStatistics(codes, values, columns, confidence, scratch);
  }

  // Raw GNSS positions (before camera correction).
  let raw: RawSummary | null = null;
  let rawDE: Float64Array | null = null;
  let rawDN: Float64Array | null = null;
  if (planted.rawX && planted.rawY) {
    const rx = planted.rawX;
    const ry = planted.rawY;
    rawDE = new Float64Array(n).fill(Number.NaN);
    rawDN = new Float64Array(n).fill(Number.NaN);
    const pi = pairing.plantedIndex;
    let m = 0;
    for (let i = 0; i < n; i++) {
      const p = pi[i];
      if (Number.isFinite(rx[p]) && Number.isFinite(ry[p])) m++;
    }
    const keep = new Int32Array(m);
    for (let i = 0, j = 0; i < n; i++) {
      const p = pi[i];
      if (Number.isFinite(rx[p]) && Number.isFinite(ry[p])) keep[j++] = i;
    }
    if (m > 0) {
      const rawColumns = errorColumns(rx, ry, survey, pairing, bearing, limits, keep);
      for (let j = 0; j < m; j++) {
        rawDE[keep[j]] = rawColumns.dE[j];
        rawDN[keep[j]] = rawColumns.dN[j];
      }
      raw = { ...headlineStatistics(rawColumns, limits, confidence, scratch), missingRaw: n - m };
    }
  }

  let byId = 0;
  let beyond = 0;
  const method = pairing.method;
  const beyondFlags = pairing.beyondMaxDistance;
  for (let i = 0; i < n; i++) {
    if (method[i] === PAIRED_BY_ID) byId++;
    if (beyondFlags[i]) beyond++;
  }

  const notes: AuditNote[] = [];
  if (n === 0)
    notes.push({ code: "no-pairs", message: "No plant could be paired with a survey point; all statistics are null." });
  if (n === 1)
    notes.push({ code: "single-pair", message: "Only one pair: no standard deviation, confidence interval or fit." });
  if (n > 0 && n < 20) {
    notes.push({
      code: "few-checkpoints",
      message: `Only ${n} checkpoints; FGDC-STD-007.3-1998 asks for at least 20, and intervals are wide.`,
    });
  }
  if (headline.nssdaCase === "not-applicable") {
    notes.push({ code: "nssda-not-applicable", message: headline.nssdaNote ?? "" });
  }
  if (beyond > 0) {
    notes.push({
      code: "beyond-max-distance",
      message: `${beyond} pair${beyond === 1 ? " was" : "s were"} paired by id although farther apart than the maximum pairing distance; they are included.`,
    });
  }
  if (outliers.count > 0) {
    notes.push({
      code: "outliers",
      message: `${outliers.count} pair${outliers.count === 1 ? " is" : "s are"} flagged as outliers; see withoutOutliers.`,
    });
  }
  if (raw && raw.missingRaw > 0) {
    notes.push({
      code: "raw-partial",
      message: `${raw.missingRaw} paired plants have no raw GNSS position and are left out of raw.`,
    });
  }

  const { pairs: _pairs, ...headlineRest } = headline;
  const summary: AuditSummary = {
    status: n === 0 ? "no-pairs" : "ok",
    crs: planted.crs,
    confidence,
    pairs: n,
    unmatchedPlanted: pairing.unmatchedPlanted.length,
    unmatchedSurvey: pairing.unmatchedSurvey.length,
    ambiguousSurvey: pairing.ambiguousSurvey.length,
    pairedBeyondMaxDistance: beyond,
    pairedById: byId,
    pairedByPosition: n - byId,
    ...headlineRest,
    rowBearingDeg: bearing,
    rowBearingSource: options.rowBearingSource ?? (bearing === null ? "none" : "given"),
    outliers: {
      rule: "median-mad-2d",
      k: options.outlierRule.k,
      minThreshold: options.outlierRule.minThreshold,
      count: outliers.count,
      threshold: finiteOrNull(outliers.threshold),
      centreDE: finiteOrNull(outliers.centreDE),
      centreDN: finiteOrNull(outliers.centreDN),
    },
    withoutOutliers,
    helmert,
    groups,
    raw,
    notes,
    engineVersion: ENGINE_VERSION,
  };

  const residuals: AuditResiduals = {
    plantedIndex: pairing.plantedIndex.slice(),
    surveyIndex: pairing.surveyIndex.slice(),
    method: pairing.method.slice(),
    beyondMaxDistance: pairing.beyondMaxDistance.slice(),
    dE: columns.dE,
    dN: columns.dN,
    along: columns.along,
    cross: columns.cross,
    radial: columns.radial,
    withinTolerance: columns.within,
    outlier: outliers.flags,
    rawDE,
    rawDN,
  };
  return { summary, residuals };
}
