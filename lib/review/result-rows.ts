/**
 * Per-plant rows of a fresh computation, in the stored columns, so a verification can digest them the
 * same way as the rows in the database; lib/server/audits/run-audit.ts stores exactly these rows. Pure.
 */
import { PAIRED_BY_ID, type PointTable, type ProjectedTable } from "@/geo";
import { localDay, type AuditResult } from "@/lib/audit";
import type { ResidualRecordRow, UnpairedRecordRow } from "./record";

type AttrName = "crop" | "bed" | "row" | "arm" | "fix";

function attr(t: PointTable, name: AttrName, i: number): string | null {
  const col = t.attrs[name];
  if (!col) return null;
  const c = col.codes[i];
  return c >= 0 ? col.values[c] : null;
}

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

export function unpairedRecordRows(
  pairing: { unmatchedPlanted: Int32Array; unmatchedSurvey: Int32Array; ambiguousSurvey: Int32Array },
  planted: ProjectedTable,
  survey: ProjectedTable,
): UnpairedRecordRow[] {
  const rows: UnpairedRecordRow[] = [];
  const add = (kind: string, t: ProjectedTable, idx: Int32Array) => {
    for (const i of idx) {
      rows.push({
        seq: rows.length,
        kind,
        pointId: t.id?.get(i) || null,
        line: t.line[i],
        e: t.x[i],
        n: t.y[i],
        crop: attr(t, "crop", i),
        bed: attr(t, "bed", i),
        row: attr(t, "row", i),
      });
    }
  };
  add("planted-not-found", planted, pairing.unmatchedPlanted);
  add("surveyed-not-planted", survey, pairing.unmatchedSurvey);
  add("ambiguous", survey, pairing.ambiguousSurvey);
  return rows;
}
