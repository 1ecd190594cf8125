import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { deletePreset } from "@/db/queries/presets";
import { notFound } from "@/lib/errors";
import { CAN_PREPARE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";

export const DELETE = guardedRoute<{ id: string }>(CAN_PREPARE, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Preset");
  if (!(await deletePreset(await getDb(), { id, orgId: viewer.orgId }))) throw notFound("Preset");
  return new Response(null, { status: 204 });
});
