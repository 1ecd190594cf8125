import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { listAudits, listRecentDatasets } from "@/db/queries/audits";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { FieldIdParam } from "@/lib/validation/field";

export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const parsed = FieldIdParam.safeParse(params);
  // A malformed id and another organisation's id get the same answer.
  if (!parsed.success) throw notFound("Field");
  const db = await getDb();
  const fieldRow = await getFieldById(db, { id: parsed.data.fieldId, orgId: viewer.orgId });
  if (!fieldRow) throw notFound("Field");
  const [datasets, audits] = await Promise.all([
    listRecentDatasets(db, { orgId: viewer.orgId, fieldId: fieldRow.id }),
    listAudits(db, { orgId: viewer.orgId, fieldId: fieldRow.id }),
  ]);
  return Response.json({ field: fieldRow, datasets, audits });
});
