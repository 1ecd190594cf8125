import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { revokeApiKey } from "@/db/queries/api-keys";
import { notFound } from "@/lib/errors";
import { CAN_MANAGE_KEYS } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";

export const DELETE = guardedRoute<{ id: string }>(CAN_MANAGE_KEYS, async ({ viewer, params }) => {
  const id = routeId(params, "id", "Live API key");
  if (!(await revokeApiKey(await getDb(), { id, orgId: viewer.orgId, userId: viewer.userId })))
    throw notFound("Live API key");
  return new Response(null, { status: 204 });
});
