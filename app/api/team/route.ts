import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { listTeamMembers } from "@/db/queries/members";
import { invitationsOf } from "@/lib/server/team/team-service";

/** Members and invitations of the owner's organisation. */
export const GET = guardedRoute(["owner"], async ({ viewer }) => {
  const members = await listTeamMembers(await getDb(), { orgId: viewer.orgId });
  return Response.json({ members, invitations: await invitationsOf(viewer.orgId) });
});
