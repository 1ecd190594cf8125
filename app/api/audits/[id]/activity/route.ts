import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { listAuditActivity } from "@/db/queries/activity";
import { reviewAuditFor } from "@/lib/server/review/review-service";
import { toActivityDtos } from "@/lib/server/review/activity";

/** Who uploaded, computed, submitted, signed, returned, verified and downloaded this audit, oldest first. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  const rows = await listAuditActivity(db, {
    orgId: viewer.orgId,
    auditId: audit.id,
    datasetIds: [audit.plantedDatasetId, audit.surveyDatasetId].filter((x): x is string => !!x),
  });
  return Response.json({ activity: toActivityDtos(rows) });
});
