import { guardedRoute } from "@/lib/server/access";
import { transitionOf } from "@/lib/review/lifecycle";
import { ReviseInput } from "@/lib/review/validation";
import { readJsonBody } from "@/lib/validation/request";
import { assertMay, reviewAuditFor, reviseAudit } from "@/lib/server/review/review-service";

/** Re-run a returned audit, with corrections, as its next revision: 202 while computing, 201 with `?wait=1`. */
export const POST = guardedRoute<{ id: string }>(transitionOf("revise").roles, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  await assertMay(db, viewer, audit, "revise");
  const input = await readJsonBody(req, ReviseInput, { optional: true });
  const wait = new URL(req.url).searchParams.get("wait") === "1";
  const revision = await reviseAudit(viewer, db, audit, input, { wait });
  return Response.json({ audit: revision }, { status: wait ? 201 : 202 });
});
