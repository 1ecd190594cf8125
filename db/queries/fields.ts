import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, dataset, field } from "@/db/schema";
import type { FieldInput } from "@/lib/validation/field";
import { logActivity } from "./activity";

export interface FieldDto {
  id: string;
  name: string;
  farm: string;
  crs: string;
  timeZone: string;
  rowBearingDeg: number | null;
  bedSpacingM: number | null;
  rowsPerBed: number | null;
  rowSpacingM: number | null;
  createdAt: string;
}

export interface FieldListItem extends FieldDto {
  datasetCount: number;
  latestAudit: { id: string; title: string; state: string; rmseR: number | null; at: string } | null;
}

const fieldColumns = {
  id: field.id, name: field.name, farm: field.farm, crs: field.crs, timeZone: field.timeZone,
  rowBearingDeg: field.rowBearingDeg, bedSpacingM: field.bedSpacingM, rowsPerBed: field.rowsPerBed,
  rowSpacingM: field.rowSpacingM, createdAt: field.createdAt,
};

function toDto(row: { createdAt: Date } & Omit<FieldDto, "createdAt">): FieldDto {
  return { ...row, createdAt: row.createdAt.toISOString() };
}

export async function listFields(db: DB, { orgId }: { orgId: string }): Promise<FieldListItem[]> {
  const rows = await db.select(fieldColumns).from(field).where(eq(field.orgId, orgId)).orderBy(asc(field.name));
  const counts = await db
    .select({ fieldId: dataset.fieldId, n: sql<number>`count(*)::int` })
    .from(dataset).where(eq(dataset.orgId, orgId)).groupBy(dataset.fieldId);
  const audits = await db
    .select({ id: audit.id, fieldId: audit.fieldId, title: audit.title, state: audit.state, summary: audit.summary, at: audit.updatedAt })
    .from(audit).where(eq(audit.orgId, orgId)).orderBy(desc(audit.updatedAt));
  return rows.map((r) => {
    const a = audits.find((x) => x.fieldId === r.id);
    const rmseR = a && a.summary && typeof (a.summary as { rmseR?: unknown }).rmseR === "number"
      ? (a.summary as { rmseR: number }).rmseR : null;
    return {
      ...toDto(r),
      datasetCount: counts.find((c) => c.fieldId === r.id)?.n ?? 0,
      latestAudit: a ? { id: a.id, title: a.title, state: a.state, rmseR, at: a.at.toISOString() } : null,
    };
  });
}

/** A field of this organisation, or null (also for another organisation's field). */
export async function getFieldById(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<FieldDto | null> {
  const [row] = await db.select(fieldColumns).from(field).where(and(eq(field.id, id), eq(field.orgId, orgId)));
  return row ? toDto(row) : null;
}

export async function createField(db: DB, { orgId, userId, input }: { orgId: string; userId: string; input: FieldInput }): Promise<FieldDto> {
  return db.transaction(async (tx) => {
    const [row] = await tx.insert(field).values({ ...input, orgId, createdBy: userId }).returning(fieldColumns);
    await logActivity(tx, { orgId, actorId: userId, action: "field.created", subjectType: "field", subjectId: row.id, detail: { name: row.name } });
    return toDto(row);
  });
}

export async function fieldNameTaken(db: DB, { orgId, name }: { orgId: string; name: string }): Promise<boolean> {
  const [row] = await db.select({ id: field.id }).from(field).where(and(eq(field.orgId, orgId), eq(field.name, name)));
  return !!row;
}
