import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { pageUnpaired } from "@/db/queries/audits";
import { AppError } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { UnpairedQuerySchema } from "@/lib/validation/audit";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const q = UnpairedQuerySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success)
    throw new AppError("invalid_input", q.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; "));
  return Response.json(await pageUnpaired(await getDb(), { auditId: audit.id, ...q.data }));
});
