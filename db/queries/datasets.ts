import "server-only";
import { and, desc, eq, inArray, or } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, dataset, datasetFile, surveyPlan } from "@/db/schema";
import { decodePoints, encodePoints } from "@/db/points-blob";
import type { ColumnMapping, InputIssue, PointTable } from "@/geo";
import type { DatasetDto } from "@/lib/api-types";
import { logActivity } from "./activity";
import { savePreset } from "./presets";
import { linkDatasetMachine } from "./machines";

const cols = {
  id: dataset.id,
  fieldId: dataset.fieldId,
  kind: dataset.kind,
  fileName: dataset.fileName,
  format: dataset.format,
  sha256: dataset.sha256,
  sizeBytes: dataset.sizeBytes,
  rowCount: dataset.rowCount,
  crs: dataset.crs,
  mapping: dataset.mapping,
  acceptedWarnings: dataset.acceptedWarnings,
  uploadedBy: dataset.uploadedBy,
  uploadedAt: dataset.uploadedAt,
};

interface Row {
  id: string;
  fieldId: string;
  kind: string;
  fileName: string;
  format: string;
  sha256: string;
  sizeBytes: number;
  rowCount: number;
  crs: string;
  mapping: unknown;
  acceptedWarnings: unknown;
  uploadedBy: string | null;
  uploadedAt: Date;
}

async function inUseIds(db: DB, ids: string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set();
  const rows = await db
    .select({ p: audit.plantedDatasetId, s: audit.surveyDatasetId })
    .from(audit)
    .where(or(inArray(audit.plantedDatasetId, ids), inArray(audit.surveyDatasetId, ids)));
  return new Set(rows.flatMap((r) => [r.p, r.s]).filter((x): x is string => !!x));
}

function toDto(r: Row, inUse: Set<string>): DatasetDto {
  return {
    ...r,
    kind: r.kind as DatasetDto["kind"],
    format: r.format as DatasetDto["format"],
    mapping: (r.mapping as ColumnMapping | null) ?? null,
    acceptedWarnings: (r.acceptedWarnings as InputIssue[] | null) ?? null,
    uploadedAt: r.uploadedAt.toISOString(),
    inUse: inUse.has(r.id),
  };
}

export async function listDatasets(
  db: DB,
  { orgId, fieldId }: { orgId: string; fieldId: string },
): Promise<DatasetDto[]> {
  const rows = await db
    .select(cols)
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId)))
    .orderBy(desc(dataset.uploadedAt));
  const used = await inUseIds(
    db,
    rows.map((r) => r.id),
  );
  return rows.map((r) => toDto(r, used));
}

export async function getDatasetById(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<DatasetDto | null> {
  const [row] = await db
    .select(cols)
    .from(dataset)
    .where(and(eq(dataset.id, id), eq(dataset.orgId, orgId)));
  return row ? toDto(row, await inUseIds(db, [row.id])) : null;
}

/** Parsed points of a dataset of this organisation. */
export async function loadDatasetPoints(
  db: DB,
  { id, orgId }: { id: string; orgId: string },
): Promise<{ dto: DatasetDto; table: PointTable } | null> {
  const [row] = await db
    .select({ ...cols, points: dataset.points })
    .from(dataset)
    .where(and(eq(dataset.id, id), eq(dataset.orgId, orgId)));
  if (!row?.points) return null;
  const { points, ...rest } = row;
  return { dto: toDto(rest, new Set()), table: decodePoints(points) };
}

export async function getDatasetFile(db: DB, { id, orgId }: { id: string; orgId: string }) {
  const [row] = await db
    .select({
      fileName: dataset.fileName,
      contentType: datasetFile.contentType,
      bytes: datasetFile.bytes,
      objectKey: datasetFile.objectKey,
      sha256: dataset.sha256,
      sizeBytes: dataset.sizeBytes,
    })
    .from(dataset)
    .innerJoin(datasetFile, eq(datasetFile.datasetId, dataset.id))
    .where(and(eq(dataset.id, id), eq(dataset.orgId, orgId)));
  return row ?? null;
}

export interface NewDataset {
  orgId: string;
  fieldId: string;
  userId: string;
  kind: "planted" | "survey";
  fileName: string;
  format: "csv" | "geojson";
  contentType: string;
  bytes: Uint8Array;
  /** Set when the bytes were written to the object store under this key: the row keeps the key, not the bytes. */
  objectKey?: string | null;
  sha256: string;
  crs: string;
  mapping: ColumnMapping;
  acceptedWarnings: InputIssue[];
  table: PointTable;
  /** Save the mapping as an import preset of this name in the same transaction. */
  presetName?: string;
  /** More rows to save in the same transaction, given the new dataset's id (a survey's fieldwork record). */
  alsoSave?: (tx: Pick<DB, "insert">, datasetId: string) => Promise<void>;
  /** As-planted only: the machine that recorded the file (checked by the caller to be the organisation's). */
  machineId?: string | null;
}

/** Save the file exactly as received, its parsed points and an activity entry, all in one transaction. */
export async function createDataset(db: DB, d: NewDataset): Promise<DatasetDto> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(dataset)
      .values({
        orgId: d.orgId,
        fieldId: d.fieldId,
        kind: d.kind,
        fileName: d.fileName,
        format: d.format,
        sha256: d.sha256,
        sizeBytes: d.bytes.byteLength,
        rowCount: d.table.length,
        crs: d.crs,
        mapping: d.mapping,
        acceptedWarnings: d.acceptedWarnings.length ? d.acceptedWarnings : null,
        points: encodePoints(d.table),
        uploadedBy: d.userId,
      })
      .returning(cols);
    await tx.insert(datasetFile).values({
      datasetId: row.id,
      contentType: d.contentType,
      ...(d.objectKey ? { bytes: null, objectKey: d.objectKey } : { bytes: d.bytes, objectKey: null }),
    });
    if (d.machineId) await linkDatasetMachine(tx, { datasetId: row.id, machineId: d.machineId, orgId: d.orgId });
    if (d.presetName) {
      await savePreset(tx, {
        orgId: d.orgId,
        userId: d.userId,
        name: d.presetName,
        kind: d.kind,
        crs: d.crs,
        mapping: d.mapping,
      });
    }
    await logActivity(tx, {
      orgId: d.orgId,
      actorId: d.userId,
      action: "dataset.uploaded",
      subjectType: "dataset",
      subjectId: row.id,
      detail: { fileName: d.fileName, kind: d.kind, rows: d.table.length, sha256: d.sha256 },
    });
    if (d.alsoSave) await d.alsoSave(tx, row.id);
    return toDto(row, new Set());
  });
}

/**
 * Delete a dataset that no audit uses. Returns "deleted" (with the object key of its file, if it was kept in the
 * object store, for the caller to delete once this has committed), "missing", or the reason it is kept.
 * Audits keep their inputs: a dataset used by any audit (above all a signed-off one) stays.
 */
export async function deleteDataset(
  db: DB,
  { id, orgId, userId }: { id: string; orgId: string; userId: string },
): Promise<{ deleted: { objectKey: string | null } } | "missing" | { keptBecause: string }> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select({ id: dataset.id, fileName: dataset.fileName })
      .from(dataset)
      .where(and(eq(dataset.id, id), eq(dataset.orgId, orgId)));
    if (!row) return "missing" as const;
    const users = await tx
      .select({ title: audit.title, state: audit.state })
      .from(audit)
      .where(or(eq(audit.plantedDatasetId, id), eq(audit.surveyDatasetId, id)));
    if (users.length > 0) {
      const signed = users.find((u) => u.state === "signed_off");
      return {
        keptBecause: signed
          ? `"${row.fileName}" is an input of the signed-off audit "${signed.title}"; signed-off audits and their files can never be changed or deleted.`
          : `"${row.fileName}" is an input of ${users.length} audit(s) (e.g. "${users[0].title}"); audits keep their input files.`,
      };
    }
    const plans = await tx
      .select({ name: surveyPlan.name })
      .from(surveyPlan)
      .where(eq(surveyPlan.plantedDatasetId, id));
    if (plans.length > 0)
      return {
        keptBecause: `"${row.fileName}" is the source of ${plans.length} survey plan(s) (e.g. "${plans[0].name}"); plans keep the records they chose from.`,
      };
    const [file] = await tx
      .delete(datasetFile)
      .where(eq(datasetFile.datasetId, id))
      .returning({ objectKey: datasetFile.objectKey });
    await tx.delete(dataset).where(eq(dataset.id, id));
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "dataset.deleted",
      subjectType: "dataset",
      subjectId: id,
      detail: { fileName: row.fileName },
    });
    return { deleted: { objectKey: file?.objectKey ?? null } };
  });
}

/** The latest as-planted dataset of a field (for derived suggestions). */
export async function latestPlantedDatasetId(
  db: DB,
  { orgId, fieldId }: { orgId: string; fieldId: string },
): Promise<string | null> {
  const [row] = await db
    .select({ id: dataset.id })
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId), eq(dataset.kind, "planted")))
    .orderBy(desc(dataset.uploadedAt))
    .limit(1);
  return row?.id ?? null;
}

/** Earlier uploads of the same bytes (same SHA-256) to a field, oldest first. */
export async function findDatasetsBySha(
  db: DB,
  { orgId, fieldId, sha256 }: { orgId: string; fieldId: string; sha256: string },
): Promise<{ fileName: string; kind: string; uploadedAt: string }[]> {
  const rows = await db
    .select({ fileName: dataset.fileName, kind: dataset.kind, uploadedAt: dataset.uploadedAt })
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId), eq(dataset.sha256, sha256)))
    .orderBy(dataset.uploadedAt);
  return rows.map((r) => ({ ...r, uploadedAt: r.uploadedAt.toISOString() }));
}

/** The field's saved files (newest first, at most `limit`) with their parsed points, to compare a new file with. */
export async function listFieldPoints(
  db: DB,
  { orgId, fieldId, limit }: { orgId: string; fieldId: string; limit: number },
): Promise<{ fileName: string; kind: string; crs: string; rowCount: number; table: PointTable }[]> {
  const rows = await db
    .select({
      fileName: dataset.fileName,
      kind: dataset.kind,
      crs: dataset.crs,
      rowCount: dataset.rowCount,
      points: dataset.points,
    })
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId)))
    .orderBy(desc(dataset.uploadedAt))
    .limit(limit);
  return rows.filter((r) => r.points).map(({ points, ...r }) => ({ ...r, table: decodePoints(points as Uint8Array) }));
}

/** Row counts of all of a field's files, by kind. */
export async function fieldRowCounts(
  db: DB,
  { orgId, fieldId }: { orgId: string; fieldId: string },
): Promise<{ planted: number[]; survey: number[] }> {
  const rows = await db
    .select({ kind: dataset.kind, rowCount: dataset.rowCount })
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId)));
  return {
    planted: rows.filter((r) => r.kind === "planted").map((r) => r.rowCount),
    survey: rows.filter((r) => r.kind === "survey").map((r) => r.rowCount),
  };
}
