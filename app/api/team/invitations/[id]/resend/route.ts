import { guardedRoute } from "@/lib/server/access";
import { CAN_MANAGE_TEAM } from "@/lib/roles";
import { AuthRecordId } from "@/lib/validation/ids";
import { routeId } from "@/lib/validation/request";
import { requireBrowserSession, resend } from "@/lib/server/team/team-service";

/** Send the invitation e-mail again with a fresh expiry. */
export const POST = guardedRoute<{ id: string }>(CAN_MANAGE_TEAM, async ({ req, viewer, params }) => {
  requireBrowserSession(req);
  return Response.json(await resend(req, viewer, routeId(params, "id", "Invitation", AuthRecordId)));
});
