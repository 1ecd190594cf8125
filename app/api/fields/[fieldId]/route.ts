import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { fieldNameTaken, getFieldById, updateField } from "@/db/queries/fields";
import { listAudits } from "@/db/queries/audits";
import { listDatasets } from "@/db/queries/datasets";
import { AppError, notFound } from "@/lib/errors";
import { ANY_ROLE, CAN_PREPARE } from "@/lib/roles";
import { FieldPatch } from "@/lib/validation/field";
import { readJsonBody, routeId } from "@/lib/validation/request";

export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  // A malformed id and another organisation's id get the same answer.
  const fieldId = routeId(params, "fieldId", "Field");
  const db = await getDb();
  const fieldRow = await getFieldById(db, { id: fieldId, orgId: viewer.orgId });
  if (!fieldRow) throw notFound("Field");
  const [datasets, audits] = await Promise.all([
    listDatasets(db, { orgId: viewer.orgId, fieldId: fieldRow.id }),
    listAudits(db, { orgId: viewer.orgId, fieldId: fieldRow.id }),
  ]);
  return Response.json({ field: fieldRow, datasets, audits });
});

export const PATCH = guardedRoute<{ fieldId: string }>(CAN_PREPARE, async ({ req, viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const patch = await readJsonBody(req, FieldPatch);
  const db = await getDb();
  if (patch.name && (await fieldNameTaken(db, { orgId: viewer.orgId, name: patch.name, exceptId: fieldId }))) {
    throw new AppError("conflict", `A field named "${patch.name}" already exists.`, [
      { path: ["name"], message: "Name already used" },
    ]);
  }
  const updated = await updateField(db, { id: fieldId, orgId: viewer.orgId, userId: viewer.userId, patch });
  if (!updated) throw notFound("Field");
  return Response.json({ field: updated });
});
