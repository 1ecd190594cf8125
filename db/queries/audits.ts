import "server-only";
import { and, desc, eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { audit, dataset, field } from "@/db/schema";

export interface AuditListItem {
  id: string;
  title: string;
  state: string;
  fieldId: string;
  fieldName: string;
  updatedAt: string;
}

export async function listAudits(db: DB, { orgId, fieldId, state, limit = 20 }: { orgId: string; fieldId?: string; state?: string; limit?: number }): Promise<AuditListItem[]> {
  const where = [eq(audit.orgId, orgId)];
  if (fieldId) where.push(eq(audit.fieldId, fieldId));
  if (state) where.push(eq(audit.state, state));
  const rows = await db
    .select({ id: audit.id, title: audit.title, state: audit.state, fieldId: audit.fieldId, fieldName: field.name, updatedAt: audit.updatedAt })
    .from(audit)
    .innerJoin(field, eq(field.id, audit.fieldId))
    .where(and(...where))
    .orderBy(desc(audit.updatedAt))
    .limit(limit);
  return rows.map((r) => ({ ...r, updatedAt: r.updatedAt.toISOString() }));
}

export interface DatasetListItem {
  id: string;
  kind: string;
  fileName: string;
  rowCount: number;
  fieldId: string;
  fieldName: string;
  uploadedAt: string;
}

export async function listRecentDatasets(db: DB, { orgId, fieldId, limit = 20 }: { orgId: string; fieldId?: string; limit?: number }): Promise<DatasetListItem[]> {
  const rows = await db
    .select({ id: dataset.id, kind: dataset.kind, fileName: dataset.fileName, rowCount: dataset.rowCount, fieldId: dataset.fieldId, fieldName: field.name, uploadedAt: dataset.uploadedAt })
    .from(dataset)
    .innerJoin(field, eq(field.id, dataset.fieldId))
    .where(fieldId ? and(eq(dataset.orgId, orgId), eq(dataset.fieldId, fieldId)) : eq(dataset.orgId, orgId))
    .orderBy(desc(dataset.uploadedAt))
    .limit(limit);
  return rows.map((r) => ({ ...r, uploadedAt: r.uploadedAt.toISOString() }));
}
