import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { reviewAuditFor } from "@/lib/server/review/review-service";
import { requireResults } from "@/lib/server/review/record-sources";
import { verifyAudit } from "@/lib/server/review/verify";

/** Re-compute the audit from its raw files and compare with what is stored and what was signed. */
export const POST = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  requireResults(audit);
  return Response.json({ verification: await verifyAudit(viewer, db, audit) });
});
