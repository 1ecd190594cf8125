import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { recordTrustResponse } from "@/lib/server/map/record-trust";
import { RecordTrustQuery } from "@/lib/validation/audit";
import { readQuery } from "@/lib/validation/request";

/**
 * The trust by cause of every as-planted record (RecordTrustDto in lib/map/record-guidance.ts): the rule, the strata
 * named not to rely on, counts, and with `marks=1` the positions of the records not relied on (audit's work CRS).
 */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const query = readQuery(req, RecordTrustQuery);
  return recordTrustResponse(viewer, await auditForViewer(viewer, params), query, "json");
});
