import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { planForViewer } from "@/lib/server/plans/plans";
import { routeId } from "@/lib/validation/request";

/** One plan with its points (checkpoints and spares, in walking order). */
export const GET = guardedRoute<{ planId: string }>(ANY_ROLE, async ({ viewer, params }) =>
  Response.json({ plan: await planForViewer(viewer, routeId(params, "planId", "Survey plan")) }),
);
