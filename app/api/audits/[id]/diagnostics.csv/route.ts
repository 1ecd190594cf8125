import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { diagnosticsCsvResponse } from "@/lib/server/audits/diagnostics";

/** The diagnostics of one audit as CSV (per arm, bed × row, episodes), millimetres. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) =>
  diagnosticsCsvResponse(viewer, params),
);
