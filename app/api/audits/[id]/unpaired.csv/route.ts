import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { downloadUnpaired } from "@/lib/server/plans/unpaired-download";
import { UnpairedCsvQuery } from "@/lib/validation/plan";
import { readQuery } from "@/lib/validation/request";

/** The unpaired points; for a survey made from a plan only the sampled and surveyed ones unless `?all=1`. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) =>
  downloadUnpaired(viewer, params, readQuery(req, UnpairedCsvQuery).all === "1"),
);
