import { guardedRoute } from "@/lib/access";
import { notFound } from "@/lib/errors";
import { cancel, requireBrowserSession } from "@/lib/server/team/team-service";
import { InvitationIdParam } from "@/lib/validation/team";

/** Withdraw a pending invitation; its link stops working. */
export const DELETE = guardedRoute<{ id: string }>(["owner"], async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  const p = InvitationIdParam.safeParse(params);
  if (!p.success) throw notFound("Invitation");
  await cancel(req, viewer, p.data.id);
  return new Response(null, { status: 204 });
});
