import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { deletePreset } from "@/db/queries/presets";
import { notFound } from "@/lib/errors";
import { CAN_PREPARE } from "@/lib/roles";
import { IdParam } from "@/lib/validation/profile";

export const DELETE = guardedRoute<{ id: string }>(CAN_PREPARE, async ({ viewer, params }) => {
  const p = IdParam.safeParse(params);
  if (!p.success || !(await deletePreset(await getDb(), { id: p.data.id, orgId: viewer.orgId })))
    throw notFound("Preset");
  return new Response(null, { status: 204 });
});
