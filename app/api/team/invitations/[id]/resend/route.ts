import { guardedRoute } from "@/lib/access";
import { notFound } from "@/lib/errors";
import { requireBrowserSession, resend } from "@/lib/server/team/team-service";
import { InvitationIdParam } from "@/lib/validation/team";

/** Send the invitation e-mail again with a fresh expiry. */
export const POST = guardedRoute<{ id: string }>(["owner"], async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  const p = InvitationIdParam.safeParse(params);
  if (!p.success) throw notFound("Invitation");
  return Response.json(await resend(req, viewer, p.data.id));
});
