import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { controlMarkNameTaken, deleteControlMark, getControlMark, updateControlMark } from "@/db/queries/survey-plans";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PLAN_SURVEYS } from "@/lib/roles";
import { ControlMarkInput } from "@/lib/validation/plan";
import { readJsonBody, routeId } from "@/lib/validation/request";

const markId = (params: { markId: string }) => routeId(params, "markId", "Control mark");

export const GET = guardedRoute<{ markId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const mark = await getControlMark(await getDb(), { id: markId(params), orgId: viewer.orgId });
  if (!mark) throw notFound("Control mark");
  return Response.json({ mark });
});

/** Replace a mark's values. Surveys that used it keep the copy they were checked against. */
export const PUT = guardedRoute<{ markId: string }>(CAN_PLAN_SURVEYS, async ({ req, viewer, params }) => {
  const id = markId(params);
  const db = await getDb();
  const current = await getControlMark(db, { id, orgId: viewer.orgId });
  if (!current) throw notFound("Control mark");
  const input = await readJsonBody(req, ControlMarkInput);
  if (await controlMarkNameTaken(db, { orgId: viewer.orgId, fieldId: current.fieldId, name: input.name, exceptId: id }))
    throw new AppError("invalid_input", `This field already has a control mark called "${input.name}".`, [
      { path: ["body", "name"], message: "name taken" },
    ]);
  const mark = await updateControlMark(db, { id, orgId: viewer.orgId, userId: viewer.userId, input });
  if (!mark) throw notFound("Control mark");
  return Response.json({ mark });
});

export const DELETE = guardedRoute<{ markId: string }>(CAN_PLAN_SURVEYS, async ({ viewer, params }) => {
  const result = await deleteControlMark(await getDb(), {
    id: markId(params),
    orgId: viewer.orgId,
    userId: viewer.userId,
  });
  if (result === "missing") throw notFound("Control mark");
  if (result !== "deleted")
    throw new AppError(
      "conflict",
      `This mark was measured for ${result.usedBy} survey(s); it is kept so their instrument checks can be traced.`,
    );
  return new Response(null, { status: 204 });
});
