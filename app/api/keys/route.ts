import { z } from "zod";
import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { insertApiKey, listApiKeys } from "@/db/queries/api-keys";
import { newApiKey } from "@/lib/api-keys";
import { CAN_MANAGE_KEYS } from "@/lib/roles";
import { readJsonBody } from "@/lib/validation/request";

const KeyInput = z.object({
  name: z.string().trim().min(1, "Name the key after the script or machine that uses it.").max(80),
});

export const GET = guardedRoute(CAN_MANAGE_KEYS, async ({ viewer }) =>
  Response.json({ keys: await listApiKeys(await getDb(), { orgId: viewer.orgId }) }),
);

/** Create a key for the signed-in owner; the key itself is in this answer only. */
export const POST = guardedRoute(CAN_MANAGE_KEYS, async ({ req, viewer }) => {
  const { name } = await readJsonBody(req, KeyInput);
  const { key, prefix, hash } = newApiKey();
  const id = await insertApiKey(await getDb(), { orgId: viewer.orgId, userId: viewer.userId, name, prefix, hash });
  return Response.json({ id, name, prefix, key }, { status: 201 });
});
