import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { revokeApiKey } from "@/db/queries/api-keys";
import { notFound } from "@/lib/errors";
import { IdParam } from "@/lib/validation/profile";

export const DELETE = guardedRoute<{ id: string }>(["owner"], async ({ viewer, params }) => {
  const p = IdParam.safeParse(params);
  if (!p.success || !(await revokeApiKey(await getDb(), { id: p.data.id, orgId: viewer.orgId, userId: viewer.userId })))
    throw notFound("Live API key");
  return new Response(null, { status: 204 });
});
