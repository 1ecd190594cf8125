import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { fieldSeason } from "@/lib/server/season";

/** The field's audits over the season: headline and per-arm figures of each, in planting order. */
export const GET = guardedRoute<{ fieldId: string }>(ANY_ROLE, async ({ viewer, params }) =>
  Response.json(await fieldSeason(viewer, params)),
);
