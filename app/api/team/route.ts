import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { listTeamMembers } from "@/db/queries/members";

export const GET = guardedRoute(["owner"], async ({ viewer }) => {
  const members = await listTeamMembers(await getDb(), { orgId: viewer.orgId });
  return Response.json({ members });
});
