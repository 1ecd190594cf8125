import "server-only";
import { getDb } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { notFound } from "@/lib/errors";
import type { Viewer } from "@/lib/server/access";
import { routeId } from "@/lib/validation/request";
import type { AuditDto } from "@/lib/api-types";

/** The audit of this id in the viewer's organisation, else 404 (also for another organisation's audit). */
export async function auditForViewer(viewer: Viewer, params: { id: string }): Promise<AuditDto> {
  const id = routeId(params, "id", "Audit");
  const audit = await getAuditById(await getDb(), { id, orgId: viewer.orgId });
  if (!audit) throw notFound("Audit");
  return audit;
}
