import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getAlertRules, saveAlertRules } from "@/db/queries/alerts";
import { logActivity } from "@/db/queries/activity";
import { ANY_ROLE, CAN_SET_ALERTS } from "@/lib/roles";
import { AlertRulesInput } from "@/lib/validation/machines";
import { readJsonBody } from "@/lib/validation/request";

/** The organisation's alert thresholds (everyone may read what is watched). */
export const GET = guardedRoute(ANY_ROLE, async ({ viewer }) =>
  Response.json({ rules: await getAlertRules(await getDb(), { orgId: viewer.orgId }) }),
);

/** Set all thresholds at once; a null threshold is off. Applies to audits computed from now on. */
export const PUT = guardedRoute(CAN_SET_ALERTS, async ({ req, viewer }) => {
  const input = await readJsonBody(req, AlertRulesInput);
  const db = await getDb();
  const before = await getAlertRules(db, { orgId: viewer.orgId });
  const rules = await saveAlertRules(db, { orgId: viewer.orgId, userId: viewer.userId, input });
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "alerts.rules-changed",
    subjectType: "organisation",
    subjectId: viewer.orgId,
    detail: {
      before: {
        armCrossOffsetM: before.armCrossOffsetM,
        rmseRise: before.rmseRise,
        failedVerdict: before.failedVerdict,
      },
      after: input,
    },
  });
  return Response.json({ rules });
});
