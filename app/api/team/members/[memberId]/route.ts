import { guardedRoute } from "@/lib/server/access";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { AuthRecordId } from "@/lib/validation/ids";
import { readJsonBody, routeId } from "@/lib/validation/request";
import { changeRole, remove, requireBrowserSession } from "@/lib/server/team/team-service";
import { RoleInput } from "@/lib/validation/team";

/** Change a member's role. */
export const PATCH = guardedRoute<{ memberId: string }>(CAN_MANAGE_TEAM, async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  const memberId = routeId(params, "memberId", "Member", AuthRecordId);
  const { role } = await readJsonBody(req, RoleInput);
  const m = await changeRole(req, viewer, memberId, role);
  return Response.json({ member: { memberId: m.memberId, name: m.name, email: m.email, role: m.role } });
});

/** Remove a member from the organisation (their account stays; their past work keeps their name). */
export const DELETE = guardedRoute<{ memberId: string }>(CAN_MANAGE_TEAM, async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  await remove(req, viewer, routeId(params, "memberId", "Member", AuthRecordId));
  return new Response(null, { status: 204 });
});
