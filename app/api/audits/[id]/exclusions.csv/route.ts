import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { recordTrustResponse } from "@/lib/server/map/record-trust";
import { RecordTrustQuery } from "@/lib/validation/audit";
import { readQuery } from "@/lib/validation/request";

/** The exclusion list for the next pass as CSV (lib/map/exclusions.ts), in the field's CRS. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const query = readQuery(req, RecordTrustQuery);
  return recordTrustResponse(viewer, await auditForViewer(viewer, params), query, "csv");
});
