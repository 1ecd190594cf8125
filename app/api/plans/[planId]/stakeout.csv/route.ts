import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { planForViewer, stakeoutCsvResponse } from "@/lib/server/plans/plans";
import { routeId } from "@/lib/validation/request";

/** The plan's points for a rover or total station: point, easting, northing (field CRS), plant id, crop, bed, row, arm. */
export const GET = guardedRoute<{ planId: string }>(ANY_ROLE, async ({ viewer, params }) =>
  stakeoutCsvResponse(await planForViewer(viewer, routeId(params, "planId", "Survey plan"))),
);
