import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";
import { deriveFieldSuggestions } from "@/lib/server/fields/field-derived";

export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const field = await getFieldById(await getDb(), { id: fieldId, orgId: viewer.orgId });
  if (!field) throw notFound("Field");
  return Response.json(await deriveFieldSuggestions(field, viewer.orgId));
});
