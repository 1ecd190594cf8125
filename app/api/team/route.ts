import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { listTeamMembers } from "@/db/queries/members";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { invitationsOf } from "@/lib/server/team/team-service";

/** Members and invitations of the owner's organisation. */
export const GET = guardedRoute(CAN_MANAGE_TEAM, async ({ viewer }) => {
  const members = await listTeamMembers(await getDb(), { orgId: viewer.orgId });
  return Response.json({ members, invitations: await invitationsOf(viewer.orgId) });
});
