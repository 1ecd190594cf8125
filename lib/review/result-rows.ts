/**
 * Per-plant rows of a fresh computation, in the stored columns, so a verification can digest them the
 * same way as the rows in the database; lib/server/audits/run-audit.ts stores exactly these rows. Pure.
 */
import { PAIRED_BY_ID, type ProjectedTable } from "@/geo";
import { localDay, type AuditResult } from "@/lib/audit";
import { attr, type AttrName, unpairedRow } from "./planted-not-found";
import type { ResidualRecordRow, UnpairedRecordRow } from "./record";

export function residualRecordRows(
  result: AuditResult,
  planted: ProjectedTable,
  survey: ProjectedTable,
  timeZone: string,
): ResidualRecordRow[] {
  const r = result.residuals;
  const rows: ResidualRecordRow[] = new Array(r.plantedIndex.length);
  for (let k = 0; k < rows.length; k++) {
    const p = r.plantedIndex[k],
      s = r.surveyIndex[k];
    const pick = (name: AttrName) => attr(planted, name, p) ?? attr(survey, name, s);
    const t = planted.time ? planted.time[p] : NaN;
    rows[k] = {
      seq: k,
      plantId: planted.id?.get(p) || null,
      surveyId: survey.id?.get(s) || null,
      crop: pick("crop"),
      bed: pick("bed"),
      row: pick("row"),
      arm: pick("arm"),
      fix: pick("fix"),
      day: Number.isFinite(t) ? localDay(t, timeZone) : null,
      plantedE: planted.x[p],
      plantedN: planted.y[p],
      surveyE: survey.x[s],
      surveyN: survey.y[s],
      dE: r.dE[k],
      dN: r.dN[k],
      along: r.along ? r.along[k] : null,
      cross: r.cross ? r.cross[k] : null,
      radial: r.radial[k],
      within: r.withinTolerance ? r.withinTolerance[k] === 1 : null,
      outlier: r.outlier[k] === 1,
      pairedBy: r.method[k] === PAIRED_BY_ID ? "id" : "position",
      beyondMaxDistance: r.beyondMaxDistance[k] === 1,
    };
  }
  return rows;
}

type UnpairedPairing = { unmatchedPlanted: Int32Array; unmatchedSurvey: Int32Array; ambiguousSurvey: Int32Array };

/** Every unpaired point of a computation, in seq order: planted not found, surveyed not planted, ambiguous. */
export function unpairedRecordRows(
  pairing: UnpairedPairing,
  planted: ProjectedTable,
  survey: ProjectedTable,
): UnpairedRecordRow[] {
  const rows: UnpairedRecordRow[] = [];
  for (const i of pairing.unmatchedPlanted)
    rows.push(unpairedRow("planted-not-found", planted, i, rows.length, planted.x[i], planted.y[i]));
  rows.push(...unpairedSurveyRows(pairing, survey));
  return rows;
}

/**
 * The survey-side unpaired points only ("surveyed-not-planted", then "ambiguous"), numbered as in
 * {@link unpairedRecordRows}: after the planted records nobody surveyed.
 */
export function unpairedSurveyRows(pairing: UnpairedPairing, survey: ProjectedTable): UnpairedRecordRow[] {
  const rows: UnpairedRecordRow[] = [];
  const first = pairing.unmatchedPlanted.length;
  for (const i of pairing.unmatchedSurvey)
    rows.push(unpairedRow("surveyed-not-planted", survey, i, first + rows.length, survey.x[i], survey.y[i]));
  for (const i of pairing.ambiguousSurvey)
    rows.push(unpairedRow("ambiguous", survey, i, first + rows.length, survey.x[i], survey.y[i]));
  return rows;
}
