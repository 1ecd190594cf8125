import { guardedRoute } from "@/lib/server/access";
import { AppError } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";

/** The engine's JSON summary, with the same keys as `npm run audit`. */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  if (!audit.summary)
    throw new AppError(
      "conflict",
      audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit is still computing.",
    );
  return Response.json(audit.summary);
});
