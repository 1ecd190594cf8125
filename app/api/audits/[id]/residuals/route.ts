import { guardedRoute } from "@/lib/access";
import { getDb } from "@/db/client";
import { pageResiduals } from "@/db/queries/audits";
import { AppError } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { ResidualQuerySchema } from "@/lib/validation/audit";

/** Per-plant residuals, paged, sorted and filtered on the server. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ req, viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  const q = ResidualQuerySchema.safeParse(Object.fromEntries(new URL(req.url).searchParams));
  if (!q.success)
    throw new AppError(
      "invalid_input",
      q.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; "),
      q.error.issues.map((i) => ({ path: i.path, message: i.message })),
    );
  return Response.json(await pageResiduals(await getDb(), { auditId: audit.id, query: q.data }));
});
