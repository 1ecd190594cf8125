import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { machineSeason } from "@/lib/server/season";

/** The machine's audits over the season (any field): headline and per-arm figures of each, in planting order. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) =>
  Response.json(await machineSeason(viewer, params)),
);
