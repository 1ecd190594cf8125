import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { planForViewer, planRecords } from "@/lib/server/plans/plans";
import { routeId } from "@/lib/validation/request";

/** Every as-planted record of the plan's dataset in the field's CRS (centimetres from an origin), for the plan's map. */
export const GET = guardedRoute<{ planId: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const plan = await planForViewer(viewer, routeId(params, "planId", "Survey plan"));
  return Response.json({ records: await planRecords(plan, viewer.orgId) });
});
