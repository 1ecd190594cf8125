import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { deleteMachine, getMachineById, machineNameTaken, updateMachine } from "@/db/queries/machines";
import { logActivity } from "@/db/queries/activity";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_MANAGE_MACHINES } from "@/lib/roles";
import { MachinePatch } from "@/lib/validation/machines";
import { readJsonBody, routeId } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Machine");
  const machine = await getMachineById(await getDb(), { id, orgId: viewer.orgId });
  if (!machine) throw notFound("Machine");
  return Response.json({ machine });
});

/** Edit a machine. Uploads keep naming it; past audits are not recomputed. */
export const PATCH = guardedRoute<{ id: string }>(CAN_MANAGE_MACHINES, async ({ req, viewer, params }) => {
  const id = routeId(params, "id", "Machine");
  const patch = await readJsonBody(req, MachinePatch);
  const db = await getDb();
  const current = await getMachineById(db, { id, orgId: viewer.orgId });
  if (!current) throw notFound("Machine");
  if (patch.name && (await machineNameTaken(db, { orgId: viewer.orgId, name: patch.name, exceptId: id })))
    throw new AppError("conflict", `A machine named "${patch.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  const machine = await updateMachine(db, { id, orgId: viewer.orgId, input: patch });
  if (!machine) throw notFound("Machine");
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "machine.updated",
    subjectType: "machine",
    subjectId: id,
    detail: { before: current, after: machine },
  });
  return Response.json({ machine });
});

/** Delete a machine that no upload names (409 otherwise: the uploads and their audits keep it). */
export const DELETE = guardedRoute<{ id: string }>(CAN_MANAGE_MACHINES, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Machine");
  const db = await getDb();
  const result = await deleteMachine(db, { id, orgId: viewer.orgId });
  if (result === "missing") throw notFound("Machine");
  if (result === "in-use")
    throw new AppError(
      "conflict",
      "This machine is named by as-planted uploads and their audits, so it stays. Rename it instead.",
    );
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "machine.deleted",
    subjectType: "machine",
    subjectId: id,
  });
  return new Response(null, { status: 204 });
});
