import "server-only";
import type { DB } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { getFieldById } from "@/db/queries/fields";
import { getLatestMappedAudit, loadBedColumns } from "@/db/queries/map";
import { fieldMapSummary } from "@/lib/map/field-summary";
import type { FieldMapDto } from "@/lib/map/types";

/**
 * The grower's summary of a field: its latest audit with results, statistics and guidance per bed.
 * Null when the field is not in this organisation.
 */
export async function getFieldMapSummary(
  db: DB,
  { fieldId, orgId }: { fieldId: string; orgId: string },
): Promise<FieldMapDto | null> {
  const f = await getFieldById(db, { id: fieldId, orgId });
  if (!f) return null;
  const latest = await getLatestMappedAudit(db, { fieldId, orgId });
  const a = latest ? await getAuditById(db, { id: latest.id, orgId }) : null;
  const columns = a ? await loadBedColumns(db, { auditId: a.id, orgId }) : null;
  return fieldMapSummary({ id: f.id, name: f.name, crs: f.crs }, a, columns);
}
