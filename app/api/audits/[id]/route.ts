import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { auditForViewer } from "@/lib/server/audits/audit-access";

export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) =>
  Response.json({ audit: await auditForViewer(viewer, params) }),
);
