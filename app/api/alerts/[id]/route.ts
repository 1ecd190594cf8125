import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { setAlertAcknowledged } from "@/db/queries/alerts";
import { logActivity } from "@/db/queries/activity";
import { notFound } from "@/lib/errors";
import { CAN_SET_ALERTS } from "@/lib/roles";
import { AlertPatch } from "@/lib/validation/machines";
import { readJsonBody, routeId } from "@/lib/validation/request";

/** Acknowledge an alert (it leaves the count on the home page) or open it again. */
export const PATCH = guardedRoute<{ id: string }>(CAN_SET_ALERTS, async ({ req, viewer, params }) => {
  const id = routeId(params, "id", "Alert");
  const { acknowledged } = await readJsonBody(req, AlertPatch);
  const db = await getDb();
  if (!(await setAlertAcknowledged(db, { id, orgId: viewer.orgId, userId: viewer.userId, acknowledged })))
    throw notFound("Alert");
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: acknowledged ? "alert.acknowledged" : "alert.reopened",
    subjectType: "alert",
    subjectId: id,
  });
  return Response.json({ id, acknowledged });
});
