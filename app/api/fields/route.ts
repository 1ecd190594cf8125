import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { createField, fieldNameTaken, listFields } from "@/db/queries/fields";
import { AppError } from "@/lib/errors";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { FieldInput } from "@/lib/validation/field";
import { readJsonBody } from "@/lib/validation/request";

export const GET = guardedRoute(ANY_ROLE, async ({ viewer }) => {
  const fields = await listFields(await getDb(), { orgId: viewer.orgId });
  return Response.json({ fields });
});

export const POST = guardedRoute(CAN_PREPARE, async ({ req, viewer }) => {
  const input = await readJsonBody(req, FieldInput);
  const db = await getDb();
  if (await fieldNameTaken(db, { orgId: viewer.orgId, name: input.name })) {
    throw new AppError("conflict", `A field named "${input.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  }
  const created = await createField(db, { orgId: viewer.orgId, userId: viewer.userId, input });
  return Response.json({ field: created }, { status: 201 });
});
