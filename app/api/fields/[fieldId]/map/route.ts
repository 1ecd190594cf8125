import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { getFieldMapSummary } from "@/lib/server/map/field-map";
import { notFound } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { routeId } from "@/lib/validation/request";

/**
 * The grower's view of a field as JSON (FieldMapDto in lib/map/types.ts): the latest signed-off audit (a newer unsigned one only mentioned as pending), statistics
 * and one line of guidance per bed, and a summary line. The points themselves come from that audit's map-data.
 */
export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const fieldId = routeId(params, "fieldId", "Field");
  const summary = await getFieldMapSummary(await getDb(), { fieldId, orgId: viewer.orgId });
  if (!summary) throw notFound("Field");
  return Response.json(summary);
});
