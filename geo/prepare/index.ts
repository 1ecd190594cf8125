import { resolveCrs, type CrsEntry } from "../crs/registry";
import { DEFAULT_MAX_PAIR_DISTANCE_M, pairPoints, type MatchMode, type PairingNotes } from "../pair";
import { projectTable, resolveWorkCrs } from "../project";
import type { ColumnGuess } from "../read/columns";
import { deriveRowBearing, type RowBearing } from "../row-bearing";
import type { InputIssue, Pairing, PointTable, ProjectedTable } from "../types";
import { validateFiles } from "../validate/files";
import { hasErrors } from "../validate/issues";
import { validateTable } from "../validate/table";

/** One input file as read, with the CRS its coordinates are in. */
export interface FileInput {
  table: PointTable;
  /** "EPSG:n" or a proj string. */
  crs: string;
  /** Column guess from the reader (names columns in messages, tells lat/lon from easting/northing). */
  columns?: ColumnGuess;
}

/** Options of `prepareAudit`. */
export interface PrepareOptions {
  /** "auto" (WGS 84 UTM zone of the data) or a projected CRS. Default "auto". */
  workCrs?: string;
  match?: MatchMode;
  /** Metres; default 0.10. */
  maxDistanceM?: number;
  ambiguityRatio?: number;
  ambiguityGap?: number;
  /** Row bearing in degrees from grid north; derived from the records when omitted. */
  rowBearingDeg?: number;
  /** Files' median positions farther apart than this is an error (metres, default 5000). */
  maxCentreDistance?: number;
  issueCap?: number;
  /** Called with a stage name when that stage starts ("validate", "project", "check-files", "pair", "row-bearing") and "done" at the end; lets a caller time the stages without the core reading a clock. */
  onStage?: (stage: "validate" | "project" | "check-files" | "pair" | "row-bearing" | "done") => void;
}

/** Everything the statistics need, or the issues that stop the audit. */
export type Prepared =
  | {
      ok: true;
      planted: ProjectedTable;
      survey: ProjectedTable;
      workCrs: CrsEntry;
      pairing: Pairing;
      pairingNotes: PairingNotes;
      rowBearing: RowBearing & { given: boolean };
      issues: InputIssue[];
    }
  | { ok: false; issues: InputIssue[] };

/**
 * From two tables as read to projected, validated and paired tables: resolves both CRSs, checks each
 * table (`validateTable`), chooses the work CRS (`resolveWorkCrs`), projects (`projectTable`), checks
 * the files against each other (`validateFiles`), pairs (`pairPoints`) and takes or derives the row
 * bearing (`deriveRowBearing`). Stops at the first stage that finds an error. Inputs are not changed.
 *
 * @example
 * const r = prepareAudit({ table: planted, crs: "EPSG:4326" }, { table: survey, crs: "EPSG:32632" });
 * if (r.ok) computeAudit({ planted: r.planted, survey: r.survey, pairing: r.pairing, options });
 */
export function prepareAudit(planted: FileInput, survey: FileInput, options: PrepareOptions = {}): Prepared {
  const issues: InputIssue[] = [];
  const stage = options.onStage ?? (() => {});
  stage("validate");
  const crsOf = (f: FileInput): CrsEntry | null => {
    try {
      return resolveCrs(f.crs);
    } catch (e) {
      issues.push({
        severity: "error",
        code: "crs-unknown",
        file: f.table.source,
        value: f.crs,
        message: (e as Error).message,
      });
      return null;
    }
  };
  const pc = crsOf(planted),
    sc = crsOf(survey);
  if (!pc || !sc) return { ok: false, issues };

  issues.push(...validateTable(planted.table, pc, { columns: planted.columns, issueCap: options.issueCap }));
  issues.push(...validateTable(survey.table, sc, { columns: survey.columns, issueCap: options.issueCap }));
  if (hasErrors(issues)) return { ok: false, issues };

  let work: CrsEntry;
  try {
    work = resolveWorkCrs(options.workCrs ?? "auto", [
      { table: planted.table, crs: pc },
      { table: survey.table, crs: sc },
    ]);
  } catch (e) {
    issues.push({
      severity: "error",
      code: "work-crs-invalid",
      file: planted.table.source,
      value: options.workCrs,
      message: (e as Error).message,
    });
    return { ok: false, issues };
  }
  stage("project");
  const pp = projectTable(planted.table, pc, work);
  const sp = projectTable(survey.table, sc, work);
  stage("check-files");
  issues.push(
    ...validateFiles(
      { source: planted.table, crs: pc, projected: pp },
      { source: survey.table, crs: sc, projected: sp },
      { maxCentreDistance: options.maxCentreDistance, issueCap: options.issueCap },
    ),
  );
  if (hasErrors(issues)) return { ok: false, issues };

  stage("pair");
  const maxDistanceM = options.maxDistanceM ?? DEFAULT_MAX_PAIR_DISTANCE_M;
  const pairing = pairPoints(pp, sp, {
    mode: options.match,
    maxDistanceM,
    ambiguityRatio: options.ambiguityRatio,
    ambiguityGap: options.ambiguityGap,
  });
  const { notes, ...pairs } = pairing;
  const file = sp.source;
  const n = pairs.plantedIndex.length;
  if (n === 0) {
    issues.push({
      severity: "error",
      code: "no-pairs",
      file,
      message: `no survey point could be paired with an as-planted record (match ${options.match ?? "auto"}, maximum distance ${maxDistanceM} m); check the ids, the CRSs or the maximum distance`,
    });
    return { ok: false, issues };
  }
  if (n < 20) {
    issues.push({
      severity: "warning",
      code: "few-pairs",
      file,
      message: `only ${n} pair(s); at least 20 checkpoints are needed for an NSSDA accuracy statement (FGDC-STD-007.3-1998 §3.2.2)`,
    });
  }
  if (notes.surveyIdsNotFound > 0) {
    issues.push({
      severity: "warning",
      code: "survey-id-not-found",
      file,
      message: `${notes.surveyIdsNotFound} survey point id(s) are not among the as-planted ids; ${options.match === "id" ? "they stay unpaired" : "they were paired by position instead"}`,
    });
  }
  let beyond = 0;
  for (let k = 0; k < n; k++) beyond += pairs.beyondMaxDistance[k];
  if (beyond > 0) {
    issues.push({
      severity: "warning",
      code: "pair-beyond-max-distance",
      file,
      message: `${beyond} pair(s) matched by id lie farther apart than ${maxDistanceM} m; they are kept and flagged`,
    });
  }
  if (pairs.ambiguousSurvey.length > 0) {
    issues.push({
      severity: "warning",
      code: "pair-ambiguous",
      file,
      line: sp.line[pairs.ambiguousSurvey[0]],
      message: `${pairs.ambiguousSurvey.length} survey point(s) have two almost equally near plants and were left unpaired`,
    });
  }

  stage("row-bearing");
  let rowBearing: RowBearing & { given: boolean };
  if (options.rowBearingDeg !== undefined) {
    const b = ((options.rowBearingDeg % 180) + 180) % 180;
    rowBearing = { bearingDeg: b, method: "none", used: 0, linearity: NaN, given: true };
  } else {
    rowBearing = { ...deriveRowBearing(pp), given: false };
    if (!Number.isFinite(rowBearing.bearingDeg) || rowBearing.linearity < 0.5) {
      issues.push({
        severity: "warning",
        code: "row-bearing-weak",
        file: pp.source,
        message: Number.isFinite(rowBearing.bearingDeg)
          ? `the row direction derived from the records (${rowBearing.bearingDeg.toFixed(1)}°) is weakly determined (linearity ${rowBearing.linearity.toFixed(2)}); give it explicitly`
          : "the row direction cannot be derived from the records; give it explicitly",
      });
    }
  }
  stage("done");
  return { ok: true, planted: pp, survey: sp, workCrs: work, pairing: pairs, pairingNotes: notes, rowBearing, issues };
}
