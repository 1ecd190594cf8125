import "server-only";
import type { DB } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { getFieldById, listFields } from "@/db/queries/fields";
import { auditTrust } from "@/lib/audit/audit-trust";
import type { TrustWord } from "@/lib/audit/trust";
import { getLatestSignedAudit, getNewestPendingAudit, loadBedColumns } from "@/db/queries/map";
import { fieldMapSummary } from "@/lib/map/field-summary";
import type { FieldMapDto } from "@/lib/map/types";
import type { RecordTrustDto } from "@/lib/map/record-guidance";
import type { AuditDto } from "@/lib/api-types";
import { AppError } from "@/lib/errors";
import { auditRecordTrust } from "./record-trust";

/** The trust by cause of a signed audit, or null when its records cannot be read back (said so on the page). */
async function recordTrustOrNull(db: DB, audit: AuditDto, orgId: string): Promise<RecordTrustDto | null> {
  try {
    return (await auditRecordTrust(db, { audit, orgId })).dto;
  } catch (e) {
    if (e instanceof AppError) return null;
    throw e;
  }
}

/**
 * The grower's summary of a field: its latest signed-off audit, statistics and guidance per bed, and a newer audit
 * waiting for sign-off, mentioned but never used. Null when the field is not in this organisation.
 */
export async function getFieldMapSummary(
  db: DB,
  { fieldId, orgId }: { fieldId: string; orgId: string },
): Promise<FieldMapDto | null> {
  const f = await getFieldById(db, { id: fieldId, orgId });
  if (!f) return null;
  const signed = await getLatestSignedAudit(db, { fieldId, orgId });
  const pending = await getNewestPendingAudit(db, { fieldId, orgId, after: signed?.computedAt ?? null });
  const a = signed ? await getAuditById(db, { id: signed.id, orgId }) : null;
  const columns = a ? await loadBedColumns(db, { auditId: a.id, orgId }) : null;
  return fieldMapSummary({ id: f.id, name: f.name, crs: f.crs, timeZone: f.timeZone }, a, columns, pending);
}

/** One field on the grower's home: its latest signed-off audit and the trust word over all its pairs. */
export interface GrowerFieldItem {
  field: { id: string; name: string; farm: string };
  signed: {
    id: string;
    title: string;
    passed: boolean | null;
    /** The trust rule over all pairs (lib/audit/audit-trust.ts); null without a profile or limits. */
    word: TrustWord | null;
    rmseR: number | null;
    /** Records by trust by cause (lib/audit/record-trust.ts); null when it cannot be judged. */
    records: RecordTrustDto["counts"] | null;
    /** The strata named not to rely on, in words. */
    causes: string[];
  } | null;
  pending: FieldMapDto["pending"];
}

/**
 * The grower's home: every field with what its latest signed-off audit says, and a newer audit waiting for sign-off
 * mentioned, never used.
 */
export async function listGrowerFields(db: DB, { orgId }: { orgId: string }): Promise<GrowerFieldItem[]> {
  const fields = await listFields(db, { orgId });
  const out: GrowerFieldItem[] = [];
  for (const f of fields) {
    const signed = await getLatestSignedAudit(db, { fieldId: f.id, orgId });
    const pending = await getNewestPendingAudit(db, { fieldId: f.id, orgId, after: signed?.computedAt ?? null });
    const a = signed ? await getAuditById(db, { id: signed.id, orgId }) : null;
    const trust = a?.summary && a.profile ? auditTrust(a.summary, a.verdict, a.profile).all : null;
    const byRecord = a?.summary && a.profile ? await recordTrustOrNull(db, a, orgId) : null;
    out.push({
      field: { id: f.id, name: f.name, farm: f.farm },
      signed: a
        ? {
            id: a.id,
            title: a.title,
            passed: a.verdict?.passed ?? null,
            word: trust?.word ?? null,
            rmseR: a.summary?.rmseR ?? null,
            records: byRecord?.counts ?? null,
            causes: byRecord?.named.map((n) => n.label) ?? [],
          }
        : null,
      pending,
    });
  }
  return out;
}

/** The trust by cause of an audit of this organisation for a page; null when the audit has none to show. */
export async function auditRecordTrustDto(
  db: DB,
  { auditId, orgId }: { auditId: string; orgId: string },
): Promise<RecordTrustDto | null> {
  const a = await getAuditById(db, { id: auditId, orgId });
  return a?.summary && a.profile ? recordTrustOrNull(db, a, orgId) : null;
}
