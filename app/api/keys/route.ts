import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { insertApiKey, listApiKeys } from "@/db/queries/api-keys";
import { newApiKey } from "@/lib/server/api-keys";
import { CAN_MANAGE_KEYS } from "@/lib/roles";
import { apiKeyInput } from "@/lib/validation/api-key";
import { readJsonBody } from "@/lib/validation/request";

export const GET = guardedRoute(CAN_MANAGE_KEYS, async ({ viewer }) =>
  Response.json({ keys: await listApiKeys(await getDb(), { orgId: viewer.orgId }) }),
);

/** Create a key for the signed-in owner (name, scope, expiresOn?); the key itself is in this answer only. */
export const POST = guardedRoute(CAN_MANAGE_KEYS, async ({ req, viewer }) => {
  const { name, scope, expiresOn } = await readJsonBody(req, apiKeyInput(new Date()));
  const { key, prefix, hash } = newApiKey();
  const id = await insertApiKey(await getDb(), {
    orgId: viewer.orgId,
    userId: viewer.userId,
    name,
    prefix,
    hash,
    scope,
    expiresAt: expiresOn,
  });
  return Response.json({ id, name, prefix, key, scope, expiresAt: expiresOn?.toISOString() ?? null }, { status: 201 });
});
