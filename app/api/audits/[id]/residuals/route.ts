import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { pageResiduals } from "@/db/queries/audits";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { ResidualQuerySchema } from "@/lib/validation/audit";
import { readQuery } from "@/lib/validation/request";

/** Per-plant residuals, paged, sorted and filtered on the server. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const query = readQuery(req, ResidualQuerySchema);
  return Response.json(await pageResiduals(await getDb(), { auditId: audit.id, query }));
});
