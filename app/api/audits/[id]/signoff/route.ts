import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { transitionOf } from "@/lib/review/lifecycle";
import { SignoffInput } from "@/lib/review/validation";
import { readJsonBody } from "@/lib/validation/request";
import { assertMay, buildReview, reviewAuditFor, signOff } from "@/lib/server/review/review-service";

/** Where the audit stands in review (and its sign-off; `?canonical=1` adds the exact JSON that was hashed). */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  const withCanonical = new URL(req.url).searchParams.get("canonical") === "1";
  return Response.json(
    { review: await buildReview(db, viewer, audit, { withCanonical }) },
    { headers: { "cache-control": "no-store" } },
  );
});

/** Sign off a submitted audit: checklist, typed name, comment when accepted with deviation. */
export const POST = guardedRoute<{ id: string }>(transitionOf("sign_off").roles, async ({ req, viewer, params }) => {
  const { db, audit } = await reviewAuditFor(viewer, params);
  await assertMay(db, viewer, audit, "sign_off");
  const input = await readJsonBody(req, SignoffInput);
  return Response.json({ review: await signOff(viewer, db, audit, input) }, { status: 201 });
});
