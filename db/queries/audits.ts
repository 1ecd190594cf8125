import "server-only";
import { and, asc, count, desc, eq, ilike, inArray, sql, type SQL } from "drizzle-orm";
import type { DB } from "@/db/client";
import { copyRows } from "@/db/copy";
import {
  activity,
  audit,
  auditPlantedNotFound,
  auditReport,
  auditResidual,
  auditUnpaired,
  dataset,
  field,
  user,
} from "@/db/schema";
import type {
  AuditDto,
  AuditListItemDto,
  AuditSettingsDto,
  AuditState,
  AuditSummary,
  ChartDataDto,
  Page,
  ProfileSnapshot,
  ResidualRowDto,
  UnpairedRowDto,
  Verdict,
} from "@/lib/api-types";
import type { ResidualQueryInput, ResidualSort } from "@/lib/validation/audit";
import { logActivity } from "./activity";
import { getDatasetMachine } from "./machines";
import { countPlantedNotFound, loadPlantedNotFound } from "./unpaired";

export type AuditListItem = AuditListItemDto;

export async function listAudits(
  db: DB,
  { orgId, fieldId, state, limit = 20 }: { orgId: string; fieldId?: string; state?: string; limit?: number },
): Promise<AuditListItemDto[]> {
  const where = [eq(audit.orgId, orgId)];
  if (fieldId) where.push(eq(audit.fieldId, fieldId));
  if (state) where.push(eq(audit.state, state));
  const rows = await db
    .select({
      id: audit.id,
      title: audit.title,
      state: audit.state,
      revision: audit.revision,
      profileName: sql<string | null>`${audit.profileSnapshot}->>'name'`,
      fieldId: audit.fieldId,
      fieldName: field.name,
      fieldTimeZone: field.timeZone,
      updatedAt: audit.updatedAt,
      summary: audit.summary,
      verdict: audit.verdict,
    })
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .where(and(...where))
    .orderBy(desc(audit.updatedAt))
    .limit(limit);
  return rows.map(({ summary, verdict, ...r }) => ({
    ...r,
    state: r.state as AuditState,
    updatedAt: r.updatedAt.toISOString(),
    rmseR: (summary as AuditSummary | null)?.rmseR ?? null,
    passed: (verdict as Verdict | null)?.passed ?? null,
  }));
}

export interface DatasetListItem {
  id: string;
  kind: string;
  fileName: string;
  rowCount: number;
  fieldId: string;
  fieldName: string;
  fieldTimeZone: string;
  uploadedAt: string;
}

export async function listRecentDatasets(
  db: DB,
  { orgId, fieldId, limit = 20 }: { orgId: string; fieldId?: string; limit?: number },
): Promise<DatasetListItem[]> {
  const rows = await db
    .select({
      id: dataset.id,
      kind: dataset.kind,
      fileName: dataset.fileName,
      rowCount: dataset.rowCount,
      fieldId: dataset.fieldId,
      fieldName: field.name,
      fieldTimeZone: field.timeZone,
      uploadedAt: dataset.uploadedAt,
    })
    .from(dataset)
    .innerJoin(field, eq(field.id, dataset.fieldId))
    .where(fieldId ? and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId)) : eq(dataset.orgId, orgId))
    .orderBy(desc(dataset.uploadedAt))
    .limit(limit);
  return rows.map((r) => ({ ...r, uploadedAt: r.uploadedAt.toISOString() }));
}

export type { ProfileSnapshot };

export async function createAudit(
  db: DB,
  a: {
    orgId: string;
    userId: string;
    fieldId: string;
    plantedDatasetId: string;
    surveyDatasetId: string;
    profileId: string;
    profileSnapshot: ProfileSnapshot;
    settings: AuditSettingsDto;
    title: string;
  },
): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(audit)
      .values({
        orgId: a.orgId,
        fieldId: a.fieldId,
        plantedDatasetId: a.plantedDatasetId,
        surveyDatasetId: a.surveyDatasetId,
        title: a.title,
        state: "computing",
        profileId: a.profileId,
        profileSnapshot: a.profileSnapshot,
        settings: a.settings,
        createdBy: a.userId,
        progress: 0,
        progressStage: "queued",
      })
      .returning({ id: audit.id });
    await logActivity(tx, {
      orgId: a.orgId,
      actorId: a.userId,
      action: "audit.created",
      subjectType: "audit",
      subjectId: row.id,
      detail: { title: a.title },
    });
    return row.id;
  });
}

export async function setAuditProgress(
  db: DB,
  { id, progress, stage }: { id: string; progress: number; stage: string },
): Promise<void> {
  await db.update(audit).set({ progress, progressStage: stage, updatedAt: new Date() }).where(eq(audit.id, id));
}

export async function failAudit(
  db: DB,
  { id, orgId, error }: { id: string; orgId: string; error: string },
): Promise<void> {
  await db.transaction(async (tx) => {
    await tx
      .update(audit)
      .set({ state: "failed", error, progressStage: "failed", updatedAt: new Date() })
      .where(eq(audit.id, id));
    await logActivity(tx, {
      orgId,
      actorId: null,
      action: "audit.failed",
      subjectType: "audit",
      subjectId: id,
      detail: { error },
    });
  });
}

export type ResidualInsert = typeof auditResidual.$inferInsert;
export type UnpairedInsert = typeof auditUnpaired.$inferInsert;
export type RowBatch = { kind: "residual"; rows: ResidualInsert[] } | { kind: "unpaired"; rows: UnpairedInsert[] };

/** Bytes per stored part of a CSV report. */
export const REPORT_PART_BYTES = 8 << 20;

/** Rows per COPY: each one holds PGlite (and so every other request) for its duration. */
const BATCH = 2000;

/**
 * Store an audit's results. Rows go in batches (so progress can be shown and other requests are
 * not held up by one long transaction); the audit only turns "computed" — and its rows only count —
 * in the final transaction. If anything fails, the rows written so far are removed again.
 */
export async function storeAuditResult(
  db: DB,
  r: {
    id: string;
    orgId: string;
    summary: AuditSummary;
    verdict: Verdict;
    settings: AuditSettingsDto;
    /** The per-plant rows, in batches (arrays or as they arrive from a worker thread); `total` rows in all. */
    rows: Iterable<RowBatch> | AsyncIterable<RowBatch>;
    total: number;
    /** With `object`, the report was written to the object store first: its row names the object instead. */
    reports: {
      kind: "residuals" | "unpaired" | "summary";
      bytes: Uint8Array;
      object?: { key: string; sha256: string } | null;
    }[];
    /**
     * The planted records nobody surveyed as one value (lib/review/planted-not-found.ts), unpaired seq
     * 0…count−1; `rows` then hold only the survey-side unpaired points. Absent: every unpaired point is a row.
     */
    plantedNotFound?: { plants: number; count: number; bytes: Uint8Array };
    onBatch?: (fraction: number) => Promise<void> | void;
  },
): Promise<void> {
  let done = 0;
  try {
    if (r.plantedNotFound) await db.insert(auditPlantedNotFound).values({ auditId: r.id, ...r.plantedNotFound });
    // Batches outside one transaction: PGlite has a single connection, and a transaction would hold
    // every other user's query until the last row of a large audit is in.
    for await (const batch of r.rows) {
      for (let i = 0; i < batch.rows.length; i += BATCH) {
        const part = batch.rows.slice(i, i + BATCH);
        if (batch.kind === "residual") await copyRows(db, auditResidual, part as ResidualInsert[]);
        else await copyRows(db, auditUnpaired, part as UnpairedInsert[]);
        done += part.length;
        await r.onBatch?.(done / Math.max(1, r.total));
        // PGlite answers without leaving the microtask queue; without a real turn of the event loop
        // no other request would be read until the last batch is in.
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    for (const report of r.reports) {
      if (report.object) {
        const { key, sha256 } = report.object;
        const size = report.bytes.length;
        await db
          .insert(auditReport)
          .values({ auditId: r.id, kind: report.kind, part: 0, objectKey: key, sizeBytes: size, sha256 });
        continue;
      }
      // In parts, a turn of the event loop after each: one 150 MB value would hold PGlite for seconds.
      for (let part = 0, at = 0; part === 0 || at < report.bytes.length; part++, at += REPORT_PART_BYTES) {
        await db
          .insert(auditReport)
          .values({ auditId: r.id, kind: report.kind, part, bytes: report.bytes.subarray(at, at + REPORT_PART_BYTES) });
        await new Promise((resolve) => setImmediate(resolve));
      }
    }
    await db.transaction(async (tx) => {
      await tx
        .update(audit)
        .set({
          state: "computed",
          summary: r.summary,
          verdict: r.verdict,
          settings: r.settings,
          progress: 1,
          progressStage: "done",
          error: null,
          computedAt: new Date(),
          updatedAt: new Date(),
        })
        .where(eq(audit.id, r.id));
      await logActivity(tx, {
        orgId: r.orgId,
        actorId: null,
        action: "audit.computed",
        subjectType: "audit",
        subjectId: r.id,
        detail: { pairs: r.summary.pairs, passed: r.verdict.passed },
      });
    });
  } catch (err) {
    await removeAuditRows(db, { id: r.id });
    throw err;
  }
}

/**
 * Remove the result rows of an audit that did not finish computing. Returns the object store keys its report rows
 * named, for the caller to delete once this has committed.
 */
export async function removeAuditRows(db: DB, { id }: { id: string }): Promise<string[]> {
  return db.transaction((tx) => deleteResultRows(tx, id));
}

type Tx = Parameters<Parameters<DB["transaction"]>[0]>[0];

async function deleteResultRows(tx: Tx, id: string): Promise<string[]> {
  await tx.delete(auditResidual).where(eq(auditResidual.auditId, id));
  await tx.delete(auditUnpaired).where(eq(auditUnpaired.auditId, id));
  await tx.delete(auditPlantedNotFound).where(eq(auditPlantedNotFound.auditId, id));
  const reports = await tx
    .delete(auditReport)
    .where(eq(auditReport.auditId, id))
    .returning({ objectKey: auditReport.objectKey });
  return reports.flatMap((r) => (r.objectKey ? [r.objectKey] : []));
}

/** An audit left "computing" by a server that stopped, as found at start-up. */
export interface InterruptedAudit {
  id: string;
  orgId: string;
  title: string;
  /** The progress stage it had reached (`queued`, `loading`, `computing`, `pairing`, `statistics`, `saving`). */
  stage: string;
  /** How often it was already started again since it last began computing (created or computed again). */
  resumptions: number;
}

/**
 * Every audit still "computing", of every organisation. Only meaningful at start-up, before this process
 * starts a computation of its own: PGlite allows one process per data directory, so none of them is running.
 */
export async function listInterruptedAudits(db: DB): Promise<InterruptedAudit[]> {
  const rows = await db
    .select({ id: audit.id, orgId: audit.orgId, title: audit.title, stage: audit.progressStage })
    .from(audit)
    .where(eq(audit.state, "computing"))
    .orderBy(asc(audit.createdAt));
  const out: InterruptedAudit[] = [];
  for (const r of rows) {
    const events = await db
      .select({ action: activity.action })
      .from(activity)
      .where(
        and(
          eq(activity.orgId, r.orgId),
          eq(activity.subjectType, "audit"),
          eq(activity.subjectId, r.id),
          inArray(activity.action, ["audit.resumed", "audit.recomputed"]),
        ),
      )
      .orderBy(asc(activity.id));
    const lastRestart = events.findLastIndex((e) => e.action === "audit.recomputed");
    const resumptions = events.slice(lastRestart + 1).filter((e) => e.action === "audit.resumed").length;
    out.push({ ...r, stage: r.stage ?? "queued", resumptions });
  }
  return out;
}

/**
 * Start an interrupted audit again: its partial rows go, progress starts over, and the activity log counts the
 * resumption with the stage it had reached. The audit stays "computing"; false when it no longer is.
 */
export async function resumeInterruptedAudit(
  db: DB,
  r: { id: string; orgId: string; stage: string; resumption: number; limit: number },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const moved = await tx
      .update(audit)
      .set({ progress: 0, progressStage: "queued", updatedAt: new Date() })
      .where(and(eq(audit.id, r.id), eq(audit.orgId, r.orgId), eq(audit.state, "computing")))
      .returning({ id: audit.id });
    if (moved.length === 0) return false;
    await deleteResultRows(tx, r.id);
    await logActivity(tx, {
      orgId: r.orgId,
      actorId: null,
      action: "audit.resumed",
      subjectType: "audit",
      subjectId: r.id,
      detail: { stage: r.stage, resumption: r.resumption, limit: r.limit },
    });
    return true;
  });
}

/**
 * Put a failed audit back to "computing" with its stored files, profile copy and settings (the caller then
 * computes it). Any rows a failed computation left are removed. False when the audit is not failed (any more).
 */
export async function restartFailedAudit(db: DB, r: { id: string; orgId: string; actorId: string }): Promise<boolean> {
  return db.transaction(async (tx) => {
    const [before] = await tx
      .select({ error: audit.error })
      .from(audit)
      .where(and(eq(audit.id, r.id), eq(audit.orgId, r.orgId)));
    const moved = await tx
      .update(audit)
      .set({ state: "computing", error: null, progress: 0, progressStage: "queued", updatedAt: new Date() })
      .where(and(eq(audit.id, r.id), eq(audit.orgId, r.orgId), eq(audit.state, "failed")))
      .returning({ id: audit.id });
    if (moved.length === 0) return false;
    await deleteResultRows(tx, r.id);
    await logActivity(tx, {
      orgId: r.orgId,
      actorId: r.actorId,
      action: "audit.recomputed",
      subjectType: "audit",
      subjectId: r.id,
      // The failure it had: the audit row no longer shows it, the log keeps it.
      detail: { previousError: before?.error ?? null },
    });
    return true;
  });
}

export async function getAuditById(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<AuditDto | null> {
  const [row] = await db
    .select({
      id: audit.id,
      title: audit.title,
      state: audit.state,
      revision: audit.revision,
      progress: audit.progress,
      progressStage: audit.progressStage,
      error: audit.error,
      fieldId: field.id,
      fieldName: field.name,
      fieldCrs: field.crs,
      fieldTimeZone: field.timeZone,
      plantedDatasetId: audit.plantedDatasetId,
      surveyDatasetId: audit.surveyDatasetId,
      profile: audit.profileSnapshot,
      settings: audit.settings,
      summary: audit.summary,
      verdict: audit.verdict,
      createdBy: user.name,
      createdAt: audit.createdAt,
      computedAt: audit.computedAt,
    })
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .leftJoin(user, eq(user.id, audit.createdBy))
    .where(and(eq(audit.id, id), eq(audit.orgId, orgId)));
  if (!row) return null;
  const ids = [row.plantedDatasetId, row.surveyDatasetId].filter((x): x is string => !!x);
  const ds = ids.length
    ? await db
        .select({ id: dataset.id, fileName: dataset.fileName, sha256: dataset.sha256, rowCount: dataset.rowCount })
        .from(dataset)
        .where(and(inArray(dataset.id, ids), eq(dataset.orgId, orgId)))
    : [];
  const machine = row.plantedDatasetId ? await getDatasetMachine(db, { datasetId: row.plantedDatasetId, orgId }) : null;
  return {
    id: row.id,
    title: row.title,
    state: row.state as AuditState,
    revision: row.revision,
    progress: row.progress,
    progressStage: row.progressStage,
    error: row.error,
    field: { id: row.fieldId, name: row.fieldName, crs: row.fieldCrs, timeZone: row.fieldTimeZone },
    planted: ds.find((d) => d.id === row.plantedDatasetId) ?? null,
    survey: ds.find((d) => d.id === row.surveyDatasetId) ?? null,
    machine,
    profile: (row.profile as ProfileSnapshot | null) ?? null,
    settings: (row.settings as AuditSettingsDto | null) ?? null,
    summary: (row.summary as AuditSummary | null) ?? null,
    verdict: (row.verdict as Verdict | null) ?? null,
    createdBy: row.createdBy,
    createdAt: row.createdAt.toISOString(),
    computedAt: row.computedAt?.toISOString() ?? null,
  };
}

/** Every column of a per-plant result row, as the residual DTOs carry them. */
export const residualCols = {
  seq: auditResidual.seq,
  plantId: auditResidual.plantId,
  surveyId: auditResidual.surveyId,
  crop: auditResidual.crop,
  bed: auditResidual.bed,
  row: auditResidual.row,
  arm: auditResidual.arm,
  fix: auditResidual.fix,
  day: auditResidual.day,
  plantedE: auditResidual.plantedE,
  plantedN: auditResidual.plantedN,
  surveyE: auditResidual.surveyE,
  surveyN: auditResidual.surveyN,
  dE: auditResidual.dE,
  dN: auditResidual.dN,
  along: auditResidual.along,
  cross: auditResidual.cross,
  radial: auditResidual.radial,
  within: auditResidual.within,
  outlier: auditResidual.outlier,
  pairedBy: auditResidual.pairedBy,
  beyondMaxDistance: auditResidual.beyondMaxDistance,
};

const SORT_COLUMN = {
  seq: auditResidual.seq,
  plantId: auditResidual.plantId,
  radial: auditResidual.radial,
  dE: auditResidual.dE,
  dN: auditResidual.dN,
  along: auditResidual.along,
  cross: auditResidual.cross,
  bed: auditResidual.bed,
  arm: auditResidual.arm,
} as const satisfies Record<ResidualSort, unknown>;

/** One page of residuals; the audit must already be known to belong to the caller's organisation. */
export async function pageResiduals(
  db: DB,
  { auditId, query }: { auditId: string; query: ResidualQueryInput },
): Promise<Page<ResidualRowDto>> {
  const where: SQL[] = [eq(auditResidual.auditId, auditId)];
  if (query.only === "out") where.push(eq(auditResidual.within, false));
  if (query.only === "outliers") where.push(eq(auditResidual.outlier, true));
  for (const key of ["arm", "crop", "bed", "fix", "day"] as const)
    if (query[key]) where.push(eq(auditResidual[key], query[key]!));
  if (query.q) where.push(ilike(auditResidual.plantId, `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`));
  const col = SORT_COLUMN[query.sort];
  const [{ total }] = await db
    .select({ total: count() })
    .from(auditResidual)
    .where(and(...where));
  const rows = await db
    .select(residualCols)
    .from(auditResidual)
    .where(and(...where))
    .orderBy(query.dir === "desc" ? sql`${col} desc nulls last` : sql`${col} asc nulls last`, asc(auditResidual.seq))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  return {
    rows: rows.map((r) => ({ ...r, pairedBy: r.pairedBy as ResidualRowDto["pairedBy"] })),
    total,
    page: query.page,
    pageSize: query.pageSize,
  };
}

const unpairedCols = {
  seq: auditUnpaired.seq,
  kind: auditUnpaired.kind,
  pointId: auditUnpaired.pointId,
  line: auditUnpaired.line,
  e: auditUnpaired.e,
  n: auditUnpaired.n,
  crop: auditUnpaired.crop,
  bed: auditUnpaired.bed,
  row: auditUnpaired.row,
};

/**
 * One page of unpaired points in seq order, optionally of one kind; the audit must already be known to belong to the
 * caller's organisation. Audits that store the planted records nobody surveyed compactly (db/queries/unpaired.ts)
 * give them as seq 0…count−1, ahead of their survey-side rows, exactly as rows would.
 */
export async function pageUnpaired(
  db: DB,
  { auditId, kind, page, pageSize }: { auditId: string; kind?: UnpairedRowDto["kind"]; page: number; pageSize: number },
): Promise<Page<UnpairedRowDto>> {
  const where = kind
    ? and(eq(auditUnpaired.auditId, auditId), eq(auditUnpaired.kind, kind))
    : eq(auditUnpaired.auditId, auditId);
  const [{ total: stored }] = await db.select({ total: count() }).from(auditUnpaired).where(where);
  const offset = (page - 1) * pageSize;
  const compact = !kind || kind === "planted-not-found" ? await countPlantedNotFound(db, { auditId }) : null;
  const lead = compact ?? 0;
  const out: UnpairedRowDto[] = [];
  if (lead > offset) {
    const set = await loadPlantedNotFound(db, { auditId });
    out.push(...set!.rows(offset, Math.min(lead, offset + pageSize)));
  }
  if (out.length < pageSize && stored > 0) {
    const rows = await db
      .select(unpairedCols)
      .from(auditUnpaired)
      .where(where)
      .orderBy(asc(auditUnpaired.seq))
      .limit(pageSize - out.length)
      .offset(Math.max(0, offset - lead));
    out.push(...rows.map((r) => ({ ...r, kind: r.kind as UnpairedRowDto["kind"] })));
  }
  return { rows: out, total: stored + lead, page, pageSize };
}

/** Up to `limit` residual rows after `afterSeq` in pairing order (keyset paging for downloads made from the rows). */
export async function residualRowsAfter(
  db: DB,
  { auditId, afterSeq, limit }: { auditId: string; afterSeq: number; limit: number },
): Promise<ResidualRowDto[]> {
  const rows = await db
    .select(residualCols)
    .from(auditResidual)
    .where(and(eq(auditResidual.auditId, auditId), sql`${auditResidual.seq} > ${afterSeq}`))
    .orderBy(asc(auditResidual.seq))
    .limit(limit);
  return rows.map((r) => ({ ...r, pairedBy: r.pairedBy as ResidualRowDto["pairedBy"] }));
}

const CHART_MAX = 20_000;

export async function chartData(db: DB, { auditId }: { auditId: string }): Promise<ChartDataDto> {
  const [{ total }] = await db.select({ total: count() }).from(auditResidual).where(eq(auditResidual.auditId, auditId));
  const step = Math.max(1, Math.ceil(total / CHART_MAX));
  const rows = await db
    .select({
      dE: auditResidual.dE,
      dN: auditResidual.dN,
      radial: auditResidual.radial,
      cross: auditResidual.cross,
      within: auditResidual.within,
    })
    .from(auditResidual)
    .where(
      step > 1
        ? and(eq(auditResidual.auditId, auditId), sql`${auditResidual.seq} % ${step} = 0`)
        : eq(auditResidual.auditId, auditId),
    )
    .orderBy(asc(auditResidual.seq));
  const hasCross = rows.some((r) => r.cross !== null);
  return {
    dE: rows.map((r) => r.dE),
    dN: rows.map((r) => r.dN),
    radial: rows.map((r) => r.radial),
    cross: hasCross ? rows.map((r) => r.cross) : null,
    within: rows.map((r) => r.within),
    sampled: step > 1,
    total,
  };
}

/** A stored part of a report: its bytes, or the object store key with the size and SHA-256 to check it against. */
export interface ReportPart {
  bytes: Uint8Array | null;
  objectKey: string | null;
  sizeBytes: number | null;
  sha256: string | null;
}

/** The stored parts of a report in order (none: no report); lib/server/audits/report-files.ts reads them. */
export async function getAuditReportParts(
  db: DB,
  { auditId, kind }: { auditId: string; kind: "residuals" | "unpaired" | "summary" },
): Promise<ReportPart[]> {
  return db
    .select({
      bytes: auditReport.bytes,
      objectKey: auditReport.objectKey,
      sizeBytes: auditReport.sizeBytes,
      sha256: auditReport.sha256,
    })
    .from(auditReport)
    .where(and(eq(auditReport.auditId, auditId), eq(auditReport.kind, kind)))
    .orderBy(asc(auditReport.part));
}

/** The parts of a stored report joined in order. */
export function joinParts(parts: readonly Uint8Array[]): Uint8Array {
  if (parts.length === 1) return parts[0];
  const out = new Uint8Array(parts.reduce((n, p) => n + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}
