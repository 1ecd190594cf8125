import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { getFieldMapSummary } from "@/lib/server/map/field-map";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { FieldIdParam } from "@/lib/validation/field";

/**
 * The grower's view of a field as JSON (FieldMapDto in lib/map/types.ts): the latest audit with results, statistics
 * and one line of guidance per bed, and a summary line. The points themselves come from that audit's map-data.
 */
export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const p = FieldIdParam.safeParse(params);
  if (!p.success) throw notFound("Field");
  const summary = await getFieldMapSummary(await getDb(), { fieldId: p.data.fieldId, orgId: viewer.orgId });
  if (!summary) throw notFound("Field");
  return Response.json(summary);
});
