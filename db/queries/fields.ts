import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, dataset, field } from "@/db/schema";
import type { FieldInput, FieldPatch } from "@/lib/validation/field";
import type { FieldDto } from "@/lib/api-types";
import { logActivity } from "./activity";

export type { FieldDto };

export interface FieldListItem extends FieldDto {
  datasetCount: number;
  latestAudit: { id: string; title: string; state: string; rmseR: number | null; at: string } | null;
}

const fieldColumns = {
  id: field.id,
  name: field.name,
  farm: field.farm,
  crs: field.crs,
  timeZone: field.timeZone,
  rowBearingDeg: field.rowBearingDeg,
  bedSpacingM: field.bedSpacingM,
  rowsPerBed: field.rowsPerBed,
  rowSpacingM: field.rowSpacingM,
  boundary: field.boundary,
  createdAt: field.createdAt,
};

function toDto(row: { createdAt: Date; boundary: unknown } & Omit<FieldDto, "createdAt" | "boundary">): FieldDto {
  return { ...row, boundary: (row.boundary as FieldDto["boundary"]) ?? null, createdAt: row.createdAt.toISOString() };
}

export async function listFields(db: DB, { orgId }: { orgId: string }): Promise<FieldListItem[]> {
  const rows = await db.select(fieldColumns).from(field).where(eq(field.orgId, orgId)).orderBy(asc(field.name));
  const counts = await db
    .select({ fieldId: dataset.fieldId, n: sql<number>`count(*)::int` })
    .from(dataset)
    .where(eq(dataset.orgId, orgId))
    .groupBy(dataset.fieldId);
  const audits = await db
    .select({
      id: audit.id,
      fieldId: audit.fieldId,
      title: audit.title,
      state: audit.state,
      summary: audit.summary,
      at: audit.updatedAt,
    })
    .from(audit)
    .where(eq(audit.orgId, orgId))
    .orderBy(desc(audit.updatedAt));
  return rows.map((r) => {
    const a = audits.find((x) => x.fieldId === r.id);
    const rmseR =
      a?.summary && typeof (a.summary as { rmseR?: unknown }).rmseR === "number"
        ? (a.summary as { rmseR: number }).rmseR
        : null;
    return {
      ...toDto(r),
      datasetCount: counts.find((c) => c.fieldId === r.id)?.n ?? 0,
      latestAudit: a ? { id: a.id, title: a.title, state: a.state, rmseR, at: a.at.toISOString() } : null,
    };
  });
}

/** A field of this organisation, or null (also for another organisation's field). */
export async function getFieldById(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<FieldDto | null> {
  const [row] = await db
    .select(fieldColumns)
    .from(field)
    .where(and(eq(field.id, id), eq(field.orgId, orgId)));
  return row ? toDto(row) : null;
}

export async function createField(
  db: DB,
  { orgId, userId, input }: { orgId: string; userId: string; input: FieldInput },
): Promise<FieldDto> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(field)
      .values({ ...input, orgId, createdBy: userId })
      .returning(fieldColumns);
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "field.created",
      subjectType: "field",
      subjectId: row.id,
      detail: { name: row.name },
    });
    return toDto(row);
  });
}

export async function fieldNameTaken(
  db: DB,
  { orgId, name, exceptId }: { orgId: string; name: string; exceptId?: string },
): Promise<boolean> {
  const rows = await db
    .select({ id: field.id })
    .from(field)
    .where(and(eq(field.orgId, orgId), eq(field.name, name)));
  return rows.some((r) => r.id !== exceptId);
}

export async function updateField(
  db: DB,
  { id, orgId, userId, patch }: { id: string; orgId: string; userId: string; patch: FieldPatch },
): Promise<FieldDto | null> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(field)
      .set({ ...patch, updatedAt: new Date() })
      .where(and(eq(field.id, id), eq(field.orgId, orgId)))
      .returning(fieldColumns);
    if (!row) return null;
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "field.updated",
      subjectType: "field",
      subjectId: id,
      detail: { changed: Object.keys(patch) },
    });
    return toDto(row);
  });
}
