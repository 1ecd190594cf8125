import { guardedRoute } from "@/lib/server/access";
import { AppError } from "@/lib/errors";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";
import { auditTrust } from "@/lib/audit/audit-trust";

/**
 * The engine's JSON summary, with the same keys as `npm run audit`, plus `trust`: the one trust rule's word for all
 * pairs and every breakdown row against the audit's profile (lib/audit/audit-trust.ts); null without a profile.
 */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const audit = await auditForViewer(viewer, params);
  if (!audit.summary)
    throw new AppError(
      "conflict",
      audit.state === "failed" ? `This audit failed: ${audit.error}` : "This audit is still computing.",
    );
  const trust = audit.profile ? auditTrust(audit.summary, audit.verdict, audit.profile) : null;
  return Response.json({ ...audit.summary, trust });
});
