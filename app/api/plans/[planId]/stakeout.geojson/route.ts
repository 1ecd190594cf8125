import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { planForViewer, stakeoutGeoJsonResponse } from "@/lib/server/plans/plans";
import { routeId } from "@/lib/validation/request";

/** The plan's points as GeoJSON (WGS 84 geometry; field-CRS easting/northing as properties). */
export const GET = guardedRoute<{ planId: string }>(ANY_ROLE, async ({ viewer, params }) =>
  stakeoutGeoJsonResponse(await planForViewer(viewer, routeId(params, "planId", "Survey plan"))),
);
