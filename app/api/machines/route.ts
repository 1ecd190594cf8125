import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { createMachine, listMachines, machineNameTaken } from "@/db/queries/machines";
import { logActivity } from "@/db/queries/activity";
import { AppError } from "@/lib/errors";
import { ANY_ROLE, CAN_MANAGE_MACHINES } from "@/lib/roles";
import { MachineInput } from "@/lib/validation/machines";
import { readJsonBody } from "@/lib/validation/request";

/** The organisation's planting machines; everyone reads them (uploads name them). */
export const GET = guardedRoute(ANY_ROLE, async ({ viewer }) =>
  Response.json({ machines: await listMachines(await getDb(), { orgId: viewer.orgId }) }),
);

export const POST = guardedRoute(CAN_MANAGE_MACHINES, async ({ req, viewer }) => {
  const input = await readJsonBody(req, MachineInput);
  const db = await getDb();
  if (await machineNameTaken(db, { orgId: viewer.orgId, name: input.name }))
    throw new AppError("conflict", `A machine named "${input.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  const machine = await createMachine(db, { orgId: viewer.orgId, userId: viewer.userId, input });
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "machine.created",
    subjectType: "machine",
    subjectId: machine.id,
    detail: { name: machine.name },
  });
  return Response.json({ machine }, { status: 201 });
});
