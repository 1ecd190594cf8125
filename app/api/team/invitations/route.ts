import { guardedRoute } from "@/lib/access";
import { parseJsonBody } from "@/lib/validation/request";
import { invitationsOf, invite, requireBrowserSession } from "@/lib/server/team/team-service";
import { InviteInput } from "@/lib/validation/team";

export const GET = guardedRoute(["owner"], async ({ viewer }) =>
  Response.json({ invitations: await invitationsOf(viewer.orgId) }),
);

/** Invite someone by e-mail with a role; the invitation expires after 7 days. */
export const POST = guardedRoute(["owner"], async ({ req, viewer }) => {
  requireBrowserSession(req);
  const input = await parseJsonBody(req, InviteInput);
  return Response.json(await invite(req, viewer, input), { status: 201 });
});
