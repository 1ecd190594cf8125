import { guardedRoute } from "@/lib/server/access";
import { transitionOf } from "@/lib/review/lifecycle";
import { SubmitInput } from "@/lib/review/validation";
import { readJsonBody } from "@/lib/validation/request";
import { assertMay, reviewAuditFor, submitAudit } from "@/lib/server/review/review-service";

/** Submit a computed audit for sign-off; the QA leads get an e-mail. */
export const POST = guardedRoute<{ id: string }>(transitionOf("submit").roles, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  await assertMay(db, viewer, audit, "submit");
  const input = await readJsonBody(req, SubmitInput, { optional: true });
  return Response.json({ review: await submitAudit(viewer, db, audit, input) });
});
