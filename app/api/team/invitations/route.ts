import { guardedRoute } from "@/lib/server/access";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { readJsonBody } from "@/lib/validation/request";
import { invitationsOf, invite, requireBrowserSession } from "@/lib/server/team/team-service";
import { InviteInput } from "@/lib/validation/team";

export const GET = guardedRoute(CAN_MANAGE_TEAM, async ({ viewer }) =>
  Response.json({ invitations: await invitationsOf(viewer.orgId) }),
);

/** Invite someone by e-mail with a role; the invitation expires after 7 days. */
export const POST = guardedRoute(CAN_MANAGE_TEAM, async ({ req, viewer }) => {
  requireBrowserSession(req);
  const input = await readJsonBody(req, InviteInput);
  return Response.json(await invite(req, viewer, input), { status: 201 });
});
