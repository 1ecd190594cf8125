import { guardedRoute } from "@/lib/server/access";
import { transitionOf } from "@/lib/review/lifecycle";
import { assertMay, reviewAuditFor } from "@/lib/server/review/review-service";
import { recomputeAudit } from "@/lib/server/audits/run-audit";

/** Compute a failed audit again with the same stored files, profile copy and settings: 202 while computing, 200 with `?wait=1`. */
export const POST = guardedRoute<{ id: string }>(transitionOf("recompute").roles, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  await assertMay(db, viewer, audit, "recompute");
  const wait = new URL(req.url).searchParams.get("wait") === "1";
  const recomputed = await recomputeAudit(viewer, db, audit.id, { wait });
  return Response.json({ audit: recomputed }, { status: wait ? 200 : 202 });
});
