import "server-only";
import type { InputIssue, PointTable, RecordedMissing } from "@/geo";
import type { DB } from "@/db/client";
import { getControlMark, getSurveyPlan, type NewSurveyRecord } from "@/db/queries/survey-plans";
import { AppError } from "@/lib/errors";
import { surveyCoverage } from "@/lib/plan/coverage";
import type { MarkCheckRecord } from "@/lib/plan/dto";
import { checkControlMark } from "@/lib/plan/instrument-check";
import { tightestLimit } from "@/lib/review/checklist";
import type { FieldworkInput } from "@/lib/validation/plan";

const sentence = (m: string) => `${m[0].toUpperCase()}${m.slice(1)}.`;

/**
 * Check what a survey upload says about its fieldwork before anything is saved: the plan and the mark must belong to
 * this field; the control-mark check is judged (a measurement more than ten times the precision away is refused);
 * the coverage of the plan is counted (a survey matching no plan point is refused). Throws 422 with the numbers.
 */
export async function prepareSurveyRecord(
  db: DB,
  r: {
    orgId: string;
    userId: string;
    fieldId: string;
    fileName: string;
    table: PointTable;
    fieldwork: FieldworkInput;
    /** Rows of the file's status column recording planned points dead or not found, and the id column's name. */
    recorded?: { rows: readonly RecordedMissing[]; idColumn?: string };
  },
): Promise<Omit<NewSurveyRecord, "datasetId">> {
  const w = r.fieldwork;
  const fileRows = r.recorded?.rows ?? [];
  const plan = w.planId ? await getSurveyPlan(db, { id: w.planId, orgId: r.orgId }) : null;
  if (w.planId && (!plan || plan.fieldId !== r.fieldId))
    throw new AppError("invalid_input", "The survey plan chosen is not a plan of this field.", [
      { path: ["fieldwork", "planId"], message: "not a plan of this field" },
    ]);
  const mark = w.controlMarkId ? await getControlMark(db, { id: w.controlMarkId, orgId: r.orgId }) : null;
  if (w.controlMarkId && (!mark || mark.fieldId !== r.fieldId))
    throw new AppError("invalid_input", "The control mark chosen is not a mark of this field.", [
      { path: ["fieldwork", "controlMarkId"], message: "not a control mark of this field" },
    ]);

  let markCheck: MarkCheckRecord | null = null;
  let instrumentCheck: NewSurveyRecord["instrumentCheck"] = null;
  if (mark && w.before && w.precisionMm !== null) {
    markCheck = {
      mark: { id: mark.id, name: mark.name, e: mark.e, n: mark.n, h: mark.h },
      before: w.before,
      after: w.after,
    };
    try {
      instrumentCheck = checkControlMark({
        markName: mark.name,
        known: mark,
        before: w.before,
        after: w.after,
        precisionMm: w.precisionMm,
        tightestLimitM: plan ? tightestLimit(plan.profile) : null,
      });
    } catch (e) {
      const message = (e as Error).message.replace(/^control mark: /, "");
      throw new AppError("invalid_input", sentence(`${r.fileName} was not saved: ${message}`), [
        { path: ["fieldwork", "before"], message },
      ]);
    }
  }

  let coverage: NewSurveyRecord["coverage"] = null;
  // The file's status rows first, then the form's list: a point the form names again takes the form's word.
  const reported = [...fileRows.map((m) => ({ name: m.id, status: m.status, line: m.line })), ...w.missing];
  if (plan) {
    const ids: (string | null)[] = [];
    for (let i = 0; i < r.table.length; i++) ids.push(r.table.id?.get(i) ?? null);
    const known = new Set(plan.points.flatMap((p) => [p.name, p.plantId]));
    const unknown = w.missing.filter((m) => !known.has(m.name));
    if (unknown.length > 0)
      throw new AppError(
        "invalid_input",
        `${unknown.length} point(s) reported missing are not in the plan "${plan.name}": ${unknown
          .slice(0, 5)
          .map((m) => m.name)
          .join(", ")}.`,
        [{ path: ["fieldwork", "missing"], message: "not a point of the plan" }],
      );
    const strangers = fileRows.filter((m) => !known.has(m.id));
    if (strangers.length > 0) {
      const column = r.recorded?.idColumn;
      const issues: InputIssue[] = strangers.slice(0, 50).map((m) => ({
        severity: "error",
        code: "status-point-not-in-plan",
        file: r.fileName,
        line: m.line,
        column,
        value: m.id,
        message: `the row records "${m.id}" as ${m.status}, but the plan "${plan.name}" has no point or plant of that name`,
      }));
      const first = strangers[0];
      throw new AppError(
        "invalid_file",
        `${r.fileName} was not saved: ${strangers.length} row(s) record a point as dead or not found that is not in the plan "${plan.name}"; first: line ${first.line}${column ? `, column ${column}` : ""}, "${first.id}".`,
        issues,
      );
    }
    try {
      coverage = surveyCoverage(
        plan.points,
        plan.strata.map((s) => ({ key: s.key, minimum: s.minimum })),
        ids,
        reported,
      );
    } catch (e) {
      const message = (e as Error).message.replace(/^coverage: /, "");
      throw new AppError("invalid_input", sentence(`${r.fileName} was not saved: ${message}`), [
        { path: ["fieldwork", "planId"], message },
      ]);
    }
  }
  return {
    orgId: r.orgId,
    userId: r.userId,
    planId: plan?.id ?? null,
    controlMarkId: mark?.id ?? null,
    markCheck,
    instrumentCheck,
    instrument: w.instrument,
    serial: w.serial,
    calibrationDate: w.calibrationDate,
    precisionMm: w.precisionMm,
    surveyor: w.surveyor,
    method: w.method,
    missingReported: plan ? reported : w.missing,
    coverage,
  };
}

/**
 * A survey file whose status column records planned points as dead or not found, uploaded without a plan: nothing
 * can count them, so the uploader is told (a warning to accept) rather than the rows vanishing silently.
 */
export function recordedWithoutPlanIssues(
  fileName: string,
  rows: readonly RecordedMissing[] | undefined,
  planChosen: boolean,
): InputIssue[] {
  if (planChosen || !rows || rows.length === 0) return [];
  const lines = rows.slice(0, 10).map((m) => m.line);
  return [
    {
      severity: "warning",
      code: "status-without-plan",
      file: fileName,
      line: lines[0],
      message: `${rows.length} row(s) record a point as dead or not found (lines ${lines.join(", ")}${rows.length > lines.length ? ", …" : ""}); they are not survey points, and with no survey plan chosen nothing counts them. Choose the plan the survey was made from to count them as recorded missing`,
    },
  ];
}
