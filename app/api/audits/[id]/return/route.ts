import { guardedRoute } from "@/lib/server/access";
import { transitionOf } from "@/lib/review/lifecycle";
import { ReturnInput } from "@/lib/review/validation";
import { readJsonBody } from "@/lib/validation/request";
import { assertMay, returnAudit, reviewAuditFor } from "@/lib/server/review/review-service";

/** Return a submitted audit for correction, with reasons; the submitter and the growers get an e-mail. */
export const POST = guardedRoute<{ id: string }>(transitionOf("return").roles, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  await assertMay(db, viewer, audit, "return");
  const input = await readJsonBody(req, ReturnInput);
  return Response.json({ review: await returnAudit(viewer, db, audit, input) });
});
