import { guardedRoute } from "@/lib/server/access";
import { getDb } from "@/db/client";
import { chartData } from "@/db/queries/audits";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  return Response.json(await chartData(await getDb(), { auditId: audit.id }));
});
