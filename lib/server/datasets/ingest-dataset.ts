import "server-only";
import crypto from "node:crypto";
import {
  COLUMN_ROLES,
  centreLonLat,
  formatFromName,
  readPoints,
  resolveCrs,
  utmFor,
  validateTable,
  hasErrors,
  type ColumnMapping,
  type CrsEntry,
  type InputIssue,
} from "@/geo";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { createDataset } from "@/db/queries/datasets";
import { keepFilesThenSave } from "@/lib/server/storage";
import { getMachineById } from "@/db/queries/machines";
import { AppError, notFound } from "@/lib/errors";
import type { UploadOkDto } from "@/lib/api-types";
import type { Viewer } from "@/lib/server/access";
import { checkFileInField } from "./field-checks";
import { createSurveyRecord } from "@/db/queries/survey-plans";
import { prepareSurveyRecord, recordedWithoutPlanIssues } from "@/lib/server/plans/fieldwork";
import type { FieldworkInput } from "@/lib/validation/plan";

export interface IngestRequest {
  viewer: Viewer;
  fieldId: string;
  kind: "planted" | "survey";
  fileName: string;
  contentType: string;
  bytes: Uint8Array;
  /** CRS of the file's coordinates; defaults to EPSG:4326 for lat/lon and the field's CRS for easting/northing. */
  crs?: string;
  mapping?: ColumnMapping;
  acceptWarnings: boolean;
  presetName?: string;
  /** A survey's fieldwork: the plan it was made from, the control-mark check, instrument, surveyor (optional). */
  fieldwork?: FieldworkInput | null;
  /** As-planted only: the organisation's machine that recorded the file. */
  machineId?: string;
  onProgress?: (stage: "reading" | "checking" | "saving", fraction: number) => void;
}

const SLICE = 1 << 20;

/** The bytes in 1 MiB slices, reporting how far reading has got. */
async function* slices(bytes: Uint8Array, report: (fraction: number) => void): AsyncGenerator<Uint8Array> {
  for (let i = 0; i < bytes.length; i += SLICE) {
    yield bytes.subarray(i, Math.min(bytes.length, i + SLICE));
    report(Math.min(1, (i + SLICE) / bytes.length));
    await new Promise((r) => setImmediate(r)); // let other requests in between slices
  }
}

/**
 * Read, check and save one uploaded file. Nothing is saved when the file has an error, or has
 * warnings the uploader has not accepted. Throws AppError (invalid_file / warnings_unaccepted with the issues).
 */
export async function ingestDataset(r: IngestRequest): Promise<UploadOkDto> {
  const progress = r.onProgress ?? (() => {});
  const db = await getDb();
  const field = await getFieldById(db, { id: r.fieldId, orgId: r.viewer.orgId });
  if (!field) throw notFound("Field");
  // Machines (issue 13): checked before the file is read, so a wrong machine saves nothing.
  if (r.machineId) {
    if (r.kind !== "planted")
      throw new AppError("invalid_input", "Only as-planted records name a machine; a survey file does not.", [
        { path: ["machineId"], message: "Leave the machine empty for a survey file" },
      ]);
    if (!(await getMachineById(db, { id: r.machineId, orgId: r.viewer.orgId })))
      throw new AppError("invalid_input", "There is no such machine in this organisation. Choose one from the list.", [
        { path: ["machineId"], message: "No such machine" },
      ]);
  }
  if (r.bytes.byteLength === 0) {
    throw new AppError("invalid_file", `${r.fileName} is empty.`, [
      {
        severity: "error",
        code: "file-empty",
        file: r.fileName,
        message: "the file is empty: expected a header line and one row per point",
      },
    ]);
  }

  const format = formatFromName(r.fileName);
  progress("reading", 0);
  const read = await readPoints(
    slices(r.bytes, (f) => progress("reading", f)),
    {
      source: r.fileName,
      role: r.kind,
      mapping: r.mapping,
      timeZone: field.timeZone,
      format,
    },
  );
  const issues: InputIssue[] = [...read.issues];
  if (!read.table || hasErrors(issues)) throw fileError(r.fileName, issues);

  progress("checking", 0);
  const crsSpec = r.crs ?? read.crsHint ?? (read.columns.coordinates === "projected" ? field.crs : "EPSG:4326");
  let crs: CrsEntry;
  try {
    crs = resolveCrs(crsSpec);
  } catch (e) {
    throw new AppError("invalid_input", (e as Error).message, [{ path: ["crs"], message: (e as Error).message }]);
  }
  issues.push(...validateTable(read.table, crs, { columns: read.columns }));
  if (hasErrors(issues)) throw fileError(r.fileName, issues);
  const sha256 = crypto.createHash("sha256").update(r.bytes).digest("hex");
  issues.push(
    ...(await checkFileInField(db, {
      orgId: r.viewer.orgId,
      field,
      kind: r.kind,
      fileName: r.fileName,
      table: read.table,
      crs,
      columns: read.columns,
      sha256,
    })),
  );
  if (hasErrors(issues)) throw fileError(r.fileName, issues);
  issues.push(...recordedWithoutPlanIssues(r.fileName, read.recordedMissing, !!r.fieldwork?.planId));
  const warnings = issues.filter((i) => i.severity === "warning");
  if (warnings.length > 0 && !r.acceptWarnings) {
    throw new AppError(
      "warnings_unaccepted",
      `${r.fileName} has ${warnings.length} warning(s) to read before it can be saved.`,
      warnings,
    );
  }
  if (r.fieldwork && r.kind !== "survey")
    throw new AppError("invalid_input", "Fieldwork (plan, control mark, instrument) belongs to a survey upload.", [
      { path: ["fieldwork"], message: "only for kind=survey" },
    ]);
  const record = r.fieldwork
    ? await prepareSurveyRecord(db, {
        orgId: r.viewer.orgId,
        userId: r.viewer.userId,
        fieldId: field.id,
        fileName: r.fileName,
        table: read.table,
        fieldwork: r.fieldwork,
        recorded: { rows: read.recordedMissing ?? [], idColumn: read.columns.columns.id },
      })
    : null;
  progress("checking", 1);

  progress("saving", 0);
  // Roles the uploader said are not in the file stay null, so reading the file again (review) or a preset made
  // from it does not guess them back.
  const notInFile = Object.fromEntries(
    COLUMN_ROLES.filter((role) => r.mapping?.[role] === null).map((role) => [role, null]),
  );
  const mapping: ColumnMapping = {
    ...notInFile,
    ...read.columns.columns,
    ...(read.columns.coordinates ? { coordinates: read.columns.coordinates } : {}),
  };
  const table = read.table;
  const contentType = r.contentType || (format === "geojson" ? "application/geo+json" : "text/csv");
  // In server mode with an object store the file goes there first; the rows name it (and it is removed if they fail).
  const saved = await keepFilesThenSave(
    [{ orgId: r.viewer.orgId, name: "uploads", bytes: r.bytes, contentType }],
    ([placed]) =>
      createDataset(db, {
        orgId: r.viewer.orgId,
        fieldId: field.id,
        userId: r.viewer.userId,
        kind: r.kind,
        fileName: r.fileName,
        format,
        contentType,
        bytes: r.bytes,
        objectKey: placed.objectKey,
        sha256,
        crs: crs.code === "custom" ? crsSpec : crs.code,
        mapping,
        acceptedWarnings: warnings,
        table,
        presetName: r.presetName,
        alsoSave: record ? (tx, datasetId) => createSurveyRecord(tx, { ...record, datasetId }) : undefined,
        machineId: r.machineId ?? null,
      }),
  );
  progress("saving", 1);
  const [lon, lat] = centreLonLat(read.table, crs);
  return {
    dataset: saved,
    warnings,
    columns: read.columns,
    suggestedCrs: Number.isFinite(lon) && Number.isFinite(lat) ? utmFor(lon, lat).code : null,
  };
}

function fileError(fileName: string, issues: InputIssue[]): AppError {
  const errors = issues.filter((i) => i.severity === "error");
  const first = errors[0];
  const where = first?.line ? ` (line ${first.line}${first.column ? `, column ${first.column}` : ""})` : "";
  return new AppError(
    "invalid_file",
    `${fileName} cannot be used: ${errors.length} error(s), first${where}: ${first?.message ?? "unknown"}. Nothing was saved.`,
    issues,
  );
}
