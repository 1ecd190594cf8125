import "server-only";
import { and, asc, desc, eq, inArray, or, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { type ReportPart, residualCols } from "./audits";
import {
  audit,
  auditReport,
  auditResidual,
  auditReviewEvent,
  auditSignoff,
  auditUnpaired,
  dataset,
  datasetFile,
  field,
  user,
} from "@/db/schema";
import type { AuditSettingsDto, AuditSummary, ProfileSnapshot, Verdict } from "@/lib/api-types";
import type { LifecycleState } from "@/lib/review/lifecycle";
import type { ChecklistRecord } from "@/lib/review/checklist";
import type { ReturnReason } from "@/lib/review/return-reasons";
import type { RecordDataset, ResidualRecordRow, UnpairedRecordRow } from "@/lib/review/record";
import type { ReviewEventDto, RevisionLinkDto, SignoffDto } from "@/lib/review/types";
import { logActivity } from "./activity";
import { loadPlantedNotFound } from "./unpaired";

type Tx = Parameters<Parameters<DB["transaction"]>[0]>[0];

export interface AuditReviewRow {
  id: string;
  orgId: string;
  title: string;
  state: LifecycleState;
  revision: number;
  revisionOf: string | null;
  seriesId: string | null;
  fieldId: string;
  fieldName: string;
  fieldCrs: string;
  fieldTimeZone: string;
  plantedDatasetId: string | null;
  surveyDatasetId: string | null;
  profileId: string | null;
  profile: ProfileSnapshot | null;
  settings: AuditSettingsDto | null;
  summary: AuditSummary | null;
  verdict: Verdict | null;
  createdById: string | null;
  createdAt: Date;
  computedAt: Date | null;
}

const reviewCols = {
  id: audit.id,
  orgId: audit.orgId,
  title: audit.title,
  state: audit.state,
  revision: audit.revision,
  revisionOf: audit.revisionOf,
  seriesId: audit.seriesId,
  fieldId: audit.fieldId,
  fieldName: field.name,
  fieldCrs: field.crs,
  fieldTimeZone: field.timeZone,
  plantedDatasetId: audit.plantedDatasetId,
  surveyDatasetId: audit.surveyDatasetId,
  profileId: audit.profileId,
  profile: audit.profileSnapshot,
  settings: audit.settings,
  summary: audit.summary,
  verdict: audit.verdict,
  createdById: audit.createdBy,
  createdAt: audit.createdAt,
  computedAt: audit.computedAt,
};

/** The audit with what review needs; null for another organisation's audit. */
export async function getAuditForReview(
  db: DB | Tx,
  { id, orgId }: { id: string; orgId: string },
): Promise<AuditReviewRow | null> {
  const [row] = await db
    .select(reviewCols)
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .where(and(eq(audit.id, id), eq(audit.orgId, orgId)));
  if (!row) return null;
  return {
    ...row,
    state: row.state as LifecycleState,
    profile: row.profile as ProfileSnapshot | null,
    settings: row.settings as AuditSettingsDto | null,
    summary: row.summary as AuditSummary | null,
    verdict: row.verdict as Verdict | null,
  };
}

/** The corrected revision of an audit, if one was started. */
export async function getRevisionOf(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId: string },
): Promise<{ id: string; revision: number } | null> {
  const [row] = await db
    .select({ id: audit.id, revision: audit.revision })
    .from(audit)
    .where(and(eq(audit.revisionOf, auditId), eq(audit.orgId, orgId)));
  return row ?? null;
}

/** Every revision of the chain the audit belongs to, oldest first. */
export async function listRevisions(
  db: DB,
  { orgId, seriesId }: { orgId: string; seriesId: string },
): Promise<RevisionLinkDto[]> {
  const rows = await db
    .select({
      id: audit.id,
      revision: audit.revision,
      state: audit.state,
      title: audit.title,
      createdAt: audit.createdAt,
    })
    .from(audit)
    .where(and(eq(audit.orgId, orgId), or(eq(audit.id, seriesId), eq(audit.seriesId, seriesId))))
    .orderBy(asc(audit.revision));
  return rows.map((r) => ({ ...r, state: r.state as LifecycleState, createdAt: r.createdAt.toISOString() }));
}

export async function listReviewEvents(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId: string },
): Promise<ReviewEventDto[]> {
  const rows = await db
    .select({
      id: auditReviewEvent.id,
      kind: auditReviewEvent.kind,
      revision: auditReviewEvent.revision,
      actorName: auditReviewEvent.actorName,
      actorRole: auditReviewEvent.actorRole,
      note: auditReviewEvent.note,
      reasons: auditReviewEvent.reasons,
      detail: auditReviewEvent.detail,
      at: auditReviewEvent.at,
    })
    .from(auditReviewEvent)
    .where(and(eq(auditReviewEvent.auditId, auditId), eq(auditReviewEvent.orgId, orgId)))
    .orderBy(asc(auditReviewEvent.at));
  return rows.map((r) => ({
    ...r,
    kind: r.kind as ReviewEventDto["kind"],
    reasons: (r.reasons as ReturnReason[] | null) ?? null,
    at: r.at.toISOString(),
  }));
}

/** The user id of whoever last submitted the audit. */
export async function lastSubmitterId(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId: string },
): Promise<string | null> {
  const [row] = await db
    .select({ actorId: auditReviewEvent.actorId })
    .from(auditReviewEvent)
    .where(
      and(
        eq(auditReviewEvent.auditId, auditId),
        eq(auditReviewEvent.orgId, orgId),
        eq(auditReviewEvent.kind, "submitted"),
      ),
    )
    .orderBy(desc(auditReviewEvent.at))
    .limit(1);
  return row?.actorId ?? null;
}

export async function getSignoff(
  db: DB,
  { auditId, orgId, withCanonical = false }: { auditId: string; orgId: string; withCanonical?: boolean },
): Promise<(SignoffDto & { signerId: string | null; canonicalText: string }) | null> {
  const [row] = await db
    .select()
    .from(auditSignoff)
    .where(and(eq(auditSignoff.auditId, auditId), eq(auditSignoff.orgId, orgId)));
  if (!row) return null;
  return {
    revision: row.revision,
    signerId: row.signerId,
    signerName: row.signerName,
    signerRole: row.signerRole,
    typedName: row.typedName,
    checklist: row.checklist as ChecklistRecord,
    comment: row.comment,
    deviation: row.deviation,
    algorithm: "sha256",
    sha256: row.sha256,
    signedAt: row.signedAt.toISOString(),
    canonicalText: row.canonical,
    ...(withCanonical ? { canonical: row.canonical } : {}),
  };
}

export interface Actor {
  userId: string;
  name: string;
  role: string;
}

/**
 * Move an audit from one state to another if, and only if, it is still in `from` — in one transaction
 * with its review event and activity entry. Returns false when the audit was no longer in `from`.
 */
export async function transitionAudit(
  db: DB,
  t: {
    id: string;
    orgId: string;
    revision: number;
    from: LifecycleState;
    to: LifecycleState;
    actor: Actor;
    event: { kind: ReviewEventDto["kind"]; note?: string | null; reasons?: ReturnReason[] | null; detail?: unknown };
    activity: { action: string; detail: Record<string, unknown> };
  },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const moved = await tx
      .update(audit)
      .set({ state: t.to, updatedAt: new Date() })
      .where(and(eq(audit.id, t.id), eq(audit.orgId, t.orgId), eq(audit.state, t.from)))
      .returning({ id: audit.id });
    if (moved.length === 0) return false;
    await insertEvent(tx, { auditId: t.id, orgId: t.orgId, revision: t.revision, actor: t.actor, ...t.event });
    await logActivity(tx, {
      orgId: t.orgId,
      actorId: t.actor.userId,
      action: t.activity.action,
      subjectType: "audit",
      subjectId: t.id,
      detail: t.activity.detail,
    });
    return true;
  });
}

async function insertEvent(
  tx: Tx | DB,
  e: {
    auditId: string;
    orgId: string;
    revision: number;
    actor: Actor;
    kind: string;
    note?: string | null;
    reasons?: unknown;
    detail?: unknown;
  },
) {
  await tx.insert(auditReviewEvent).values({
    auditId: e.auditId,
    orgId: e.orgId,
    revision: e.revision,
    kind: e.kind,
    actorId: e.actor.userId,
    actorName: e.actor.name,
    actorRole: e.actor.role,
    note: e.note ?? null,
    reasons: e.reasons ?? null,
    detail: e.detail ?? null,
  });
}

/** Record a verification (the audit itself is not touched). */
export async function recordVerification(
  db: DB,
  v: {
    auditId: string;
    orgId: string;
    revision: number;
    actor: Actor;
    ok: boolean;
    failed: string[];
    sha256: string | null;
  },
): Promise<void> {
  await db.transaction(async (tx) => {
    await insertEvent(tx, {
      auditId: v.auditId,
      orgId: v.orgId,
      revision: v.revision,
      actor: v.actor,
      kind: "verified",
      detail: { ok: v.ok, failed: v.failed, sha256: v.sha256 },
    });
    await logActivity(tx, {
      orgId: v.orgId,
      actorId: v.actor.userId,
      action: "audit.verified",
      subjectType: "audit",
      subjectId: v.auditId,
      detail: { ok: v.ok, failed: v.failed.join(", ") },
    });
  });
}

/** Store the sign-off and move the audit to "signed_off" in one transaction; false when it was no longer submitted. */
export async function signOffAudit(
  db: DB,
  s: {
    auditId: string;
    orgId: string;
    revision: number;
    actor: Actor;
    typedName: string;
    checklist: ChecklistRecord;
    comment: string | null;
    deviation: boolean;
    sha256: string;
    canonical: string;
    signedAt: Date;
  },
): Promise<boolean> {
  return db.transaction(async (tx) => {
    const moved = await tx
      .update(audit)
      .set({ state: "signed_off", updatedAt: s.signedAt })
      .where(and(eq(audit.id, s.auditId), eq(audit.orgId, s.orgId), eq(audit.state, "submitted")))
      .returning({ id: audit.id });
    if (moved.length === 0) return false;
    await tx.insert(auditSignoff).values({
      auditId: s.auditId,
      orgId: s.orgId,
      revision: s.revision,
      signerId: s.actor.userId,
      signerName: s.actor.name,
      signerRole: s.actor.role,
      typedName: s.typedName,
      checklist: s.checklist,
      comment: s.comment,
      deviation: s.deviation,
      algorithm: "sha256",
      sha256: s.sha256,
      canonical: s.canonical,
      signedAt: s.signedAt,
    });
    await insertEvent(tx, {
      auditId: s.auditId,
      orgId: s.orgId,
      revision: s.revision,
      actor: s.actor,
      kind: "signed_off",
      note: s.comment,
      detail: { sha256: s.sha256, deviation: s.deviation },
    });
    await logActivity(tx, {
      orgId: s.orgId,
      actorId: s.actor.userId,
      action: "audit.signed_off",
      subjectType: "audit",
      subjectId: s.auditId,
      detail: { revision: s.revision, deviation: s.deviation, sha256: s.sha256 },
    });
    return true;
  });
}

/**
 * Create the corrected revision of a returned audit (state "computing"). The unique index on
 * revision_of makes a second revision of the same audit impossible; returns null in that case.
 */
export async function createRevisionRow(
  db: DB,
  r: {
    previous: AuditReviewRow;
    actor: Actor;
    plantedDatasetId: string;
    surveyDatasetId: string;
    profileId: string;
    profileSnapshot: ProfileSnapshot;
    settings: AuditSettingsDto;
    title: string;
  },
): Promise<string | null> {
  try {
    return await db.transaction(async (tx) => {
      const [still] = await tx.select({ state: audit.state }).from(audit).where(eq(audit.id, r.previous.id));
      if (still?.state !== "returned") return null;
      const revision = r.previous.revision + 1;
      const [row] = await tx
        .insert(audit)
        .values({
          orgId: r.previous.orgId,
          fieldId: r.previous.fieldId,
          plantedDatasetId: r.plantedDatasetId,
          surveyDatasetId: r.surveyDatasetId,
          title: r.title,
          state: "computing",
          profileId: r.profileId,
          profileSnapshot: r.profileSnapshot,
          settings: r.settings,
          createdBy: r.actor.userId,
          progress: 0,
          progressStage: "queued",
          revision,
          revisionOf: r.previous.id,
          seriesId: r.previous.seriesId ?? r.previous.id,
        })
        .returning({ id: audit.id });
      await insertEvent(tx, {
        auditId: r.previous.id,
        orgId: r.previous.orgId,
        revision: r.previous.revision,
        actor: r.actor,
        kind: "revised",
        detail: { newAuditId: row.id, newRevision: revision },
      });
      await logActivity(tx, {
        orgId: r.previous.orgId,
        actorId: r.actor.userId,
        action: "audit.revised",
        subjectType: "audit",
        subjectId: r.previous.id,
        detail: { newAuditId: row.id, newRevision: revision },
      });
      await logActivity(tx, {
        orgId: r.previous.orgId,
        actorId: r.actor.userId,
        action: "audit.created",
        subjectType: "audit",
        subjectId: row.id,
        detail: { title: r.title, revision },
      });
      return row.id;
    });
  } catch (err) {
    if (
      String((err as { code?: string }).code) === "23505" ||
      /audit_revision_of_uq/.test(String((err as Error).message))
    )
      return null;
    throw err;
  }
}

/** Everything the signed record covers, read from the database as it is now. */
export async function loadRecordMaterial(
  db: DB,
  {
    auditId,
    orgId,
    plantedDatasetId,
    surveyDatasetId,
  }: { auditId: string; orgId: string; plantedDatasetId: string; surveyDatasetId: string },
): Promise<{
  datasets: Map<string, RecordDataset>;
  residuals: ResidualRecordRow[];
  unpaired: UnpairedRecordRow[];
  /** Each report's stored parts, in order, for the server layer to read (lib/server/audits/report-files.ts). */
  reports: Partial<Record<"residuals" | "unpaired" | "summary", ReportPart[]>>;
}> {
  const ds = await db
    .select({
      datasetId: dataset.id,
      kind: dataset.kind,
      fileName: dataset.fileName,
      sha256: dataset.sha256,
      sizeBytes: dataset.sizeBytes,
      rowCount: dataset.rowCount,
      crs: dataset.crs,
      format: dataset.format,
      mapping: dataset.mapping,
    })
    .from(dataset)
    .where(and(eq(dataset.orgId, orgId), inArray(dataset.id, [plantedDatasetId, surveyDatasetId])));
  const residuals = await db
    .select(residualCols)
    .from(auditResidual)
    .where(eq(auditResidual.auditId, auditId))
    .orderBy(asc(auditResidual.seq));
  const stored = await db
    .select({
      seq: auditUnpaired.seq,
      kind: auditUnpaired.kind,
      pointId: auditUnpaired.pointId,
      line: auditUnpaired.line,
      e: auditUnpaired.e,
      n: auditUnpaired.n,
      crop: auditUnpaired.crop,
      bed: auditUnpaired.bed,
      row: auditUnpaired.row,
    })
    .from(auditUnpaired)
    .where(eq(auditUnpaired.auditId, auditId))
    .orderBy(asc(auditUnpaired.seq));
  // Planted records nobody surveyed stored compactly come first (seq 0…count−1), rebuilt exactly as their rows.
  const compact = await loadPlantedNotFound(db, { auditId, orgId });
  const unpaired: UnpairedRecordRow[] = compact ? (compact.rows() as UnpairedRecordRow[]).concat(stored) : stored;
  const reportRows = await db
    .select({
      kind: auditReport.kind,
      bytes: auditReport.bytes,
      objectKey: auditReport.objectKey,
      sizeBytes: auditReport.sizeBytes,
      sha256: auditReport.sha256,
    })
    .from(auditReport)
    .where(eq(auditReport.auditId, auditId))
    .orderBy(asc(auditReport.kind), asc(auditReport.part));
  const reports: Partial<Record<"residuals" | "unpaired" | "summary", ReportPart[]>> = {};
  for (const kind of ["residuals", "unpaired", "summary"] as const) {
    const parts = reportRows
      .filter((r) => r.kind === kind)
      .map((r) => ({ bytes: r.bytes, objectKey: r.objectKey, sizeBytes: r.sizeBytes, sha256: r.sha256 }));
    if (parts.length) reports[kind] = parts;
  }
  return { datasets: new Map(ds.map((d) => [d.datasetId, d])), residuals, unpaired, reports };
}

/** Where a dataset's raw file is kept (its bytes, or its object store key), for verification; null: no file row. */
export async function getRawFile(
  db: DB,
  { datasetId, orgId }: { datasetId: string; orgId: string },
): Promise<{ bytes: Uint8Array | null; objectKey: string | null } | null> {
  const [row] = await db
    .select({ bytes: datasetFile.bytes, objectKey: datasetFile.objectKey })
    .from(datasetFile)
    .innerJoin(dataset, eq(dataset.id, datasetFile.datasetId))
    .where(and(eq(datasetFile.datasetId, datasetId), eq(dataset.orgId, orgId)));
  return row ?? null;
}

export interface ReviewListItem {
  id: string;
  title: string;
  state: LifecycleState;
  revision: number;
  fieldId: string;
  fieldName: string;
  fieldTimeZone: string;
  /** Name of the tolerance profile this revision was computed against. */
  profileName: string | null;
  passed: boolean | null;
  /** When it entered its current state, and who moved it there. */
  since: string;
  by: string | null;
  sha256: string | null;
}

/** Audits in one review state, newest first, with who moved them there. */
export async function listAuditsInState(
  db: DB,
  { orgId, state, limit = 100 }: { orgId: string; state: LifecycleState; limit?: number },
): Promise<ReviewListItem[]> {
  const eventKind =
    state === "submitted"
      ? "submitted"
      : state === "returned"
        ? "returned"
        : state === "signed_off"
          ? "signed_off"
          : null;
  const rows = await db
    .select({
      id: audit.id,
      title: audit.title,
      state: audit.state,
      revision: audit.revision,
      fieldId: field.id,
      fieldName: field.name,
      fieldTimeZone: field.timeZone,
      profileName: sql<string | null>`${audit.profileSnapshot}->>'name'`,
      verdict: audit.verdict,
      updatedAt: audit.updatedAt,
      sha256: auditSignoff.sha256,
      by: eventKind
        ? sql<
            string | null
          >`(select e.actor_name from audit_review_event e where e.audit_id = ${audit.id} and e.kind = ${eventKind} order by e.at desc limit 1)`
        : sql<string | null>`null`,
      atMs: eventKind
        ? sql<
            number | null
          >`(select (extract(epoch from e.at) * 1000)::float8 from audit_review_event e where e.audit_id = ${audit.id} and e.kind = ${eventKind} order by e.at desc limit 1)`
        : sql<number | null>`null`,
    })
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .leftJoin(auditSignoff, eq(auditSignoff.auditId, audit.id))
    .where(and(eq(audit.orgId, orgId), eq(audit.state, state)))
    .orderBy(desc(audit.updatedAt))
    .limit(limit);
  return rows.map((r) => ({
    id: r.id,
    title: r.title,
    state: r.state as LifecycleState,
    revision: r.revision,
    fieldId: r.fieldId,
    fieldName: r.fieldName,
    fieldTimeZone: r.fieldTimeZone,
    profileName: r.profileName,
    passed: (r.verdict as Verdict | null)?.passed ?? null,
    since: r.atMs !== null && r.atMs !== undefined ? new Date(Number(r.atMs)).toISOString() : r.updatedAt.toISOString(),
    by: r.by,
    sha256: r.sha256,
  }));
}

export async function userName(
  db: DB,
  { userId }: { userId: string },
): Promise<{ name: string; email: string } | null> {
  const [row] = await db.select({ name: user.name, email: user.email }).from(user).where(eq(user.id, userId));
  return row ?? null;
}
