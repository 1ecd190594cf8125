import { guardedRoute } from "@/lib/access";
import { notFound } from "@/lib/errors";
import { parseJsonBody } from "@/lib/validation/request";
import { changeRole, remove, requireBrowserSession } from "@/lib/server/team/team-service";
import { MemberIdParam, RoleInput } from "@/lib/validation/team";

/** Change a member's role. */
export const PATCH = guardedRoute<{ memberId: string }>(["owner"], async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  const p = MemberIdParam.safeParse(params);
  if (!p.success) throw notFound("Member");
  const { role } = await parseJsonBody(req, RoleInput);
  const m = await changeRole(req, viewer, p.data.memberId, role);
  return Response.json({ member: { memberId: m.memberId, name: m.name, email: m.email, role: m.role } });
});

/** Remove a member from the organisation (their account stays; their past work keeps their name). */
export const DELETE = guardedRoute<{ memberId: string }>(["owner"], async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  const p = MemberIdParam.safeParse(params);
  if (!p.success) throw notFound("Member");
  await remove(req, viewer, p.data.memberId);
  return new Response(null, { status: 204 });
});
