import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { controlMarkNameTaken, createControlMark, listControlMarks } from "@/db/queries/survey-plans";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PLAN_SURVEYS } from "@/lib/roles";
import { ControlMarkInput } from "@/lib/validation/plan";
import { readJsonBody, routeId } from "@/lib/validation/request";

export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  if (!(await getFieldById(db, { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
  return Response.json({ marks: await listControlMarks(db, { orgId: viewer.orgId, fieldId }) });
});

/** Add a control mark (known easting/northing in the field's CRS). */
export const POST = guardedRoute<{ fieldId: string }>(CAN_PLAN_SURVEYS, async ({ req, viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  if (!(await getFieldById(db, { id: fieldId, orgId: viewer.orgId }))) throw notFound("Field");
  const input = await readJsonBody(req, ControlMarkInput);
  if (await controlMarkNameTaken(db, { orgId: viewer.orgId, fieldId, name: input.name }))
    throw new AppError("invalid_input", `This field already has a control mark called "${input.name}".`, [
      { path: ["body", "name"], message: "name taken" },
    ]);
  const mark = await createControlMark(db, { orgId: viewer.orgId, fieldId, userId: viewer.userId, input });
  return Response.json({ mark }, { status: 201 });
});
