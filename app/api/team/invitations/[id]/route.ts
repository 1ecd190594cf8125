import { guardedRoute } from "@/lib/server/access";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { AuthRecordId } from "@/lib/validation/ids";
import { routeId } from "@/lib/validation/request";
import { cancel, requireBrowserSession } from "@/lib/server/team/team-service";

/** Withdraw a pending invitation; its link stops working. */
export const DELETE = guardedRoute<{ id: string }>(CAN_MANAGE_TEAM, async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  await cancel(req, viewer, routeId(params, "id", "Invitation", AuthRecordId));
  return new Response(null, { status: 204 });
});
