import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { reviewAuditFor } from "@/lib/server/review/review-service";
import { requireResults } from "@/lib/server/review/record-sources";
import { dispatchVerification } from "@/lib/server/jobs/queue";
import { verifyForViewer } from "@/lib/server/jobs/worker";

/**
 * Re-compute the audit from its raw files and compare with what is stored and what was signed: in this process
 * (embedded) or on a worker (server mode), the answer the same.
 */
export const POST = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const { audit } = await reviewAuditFor(viewer, params);
  requireResults(audit);
  return Response.json({ verification: await dispatchVerification({ viewer, auditId: audit.id }, verifyForViewer) });
});
