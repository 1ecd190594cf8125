import { randomInt } from "node:crypto";
import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listSurveyPlans } from "@/db/queries/survey-plans";
import { notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PLAN_SURVEYS } from "@/lib/roles";
import { createPlan } from "@/lib/server/plans/plans";
import { PlanInput } from "@/lib/validation/plan";
import { readJsonBody, routeId } from "@/lib/validation/request";

/** The field's survey plans, newest first (without their points). */
export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  if (!(await getFieldById(db, { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
  return Response.json({ plans: await listSurveyPlans(db, { orgId: viewer.orgId, fieldId }) });
});

/** Make a plan: sample size from the profile, seeded selection; 422 with the numbers when it cannot be made. */
export const POST = guardedRoute<{ fieldId: string }>(CAN_PLAN_SURVEYS, async ({ req, viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  if (!(await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
  const input = await readJsonBody(req, PlanInput);
  const plan = await createPlan(viewer, fieldId, input, () => randomInt(1, 2 ** 31));
  return Response.json({ plan }, { status: 201 });
});
