import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { pageUnpaired } from "@/db/queries/audits";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { UnpairedQuerySchema } from "@/lib/validation/audit";
import { readQuery } from "@/lib/validation/request";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const query = readQuery(req, UnpairedQuerySchema);
  return Response.json(await pageUnpaired(await getDb(), { auditId: audit.id, ...query }));
});
