import { guardedRoute } from "@/lib/server/access";
import { ANY_ROLE } from "@/lib/roles";
import { auditDiagnosticsFor } from "@/lib/server/audits/diagnostics";

/**
 * Diagnostics of one audit (computed on read from its stored rows) and the comparison with the previous audit of the
 * same machine (else field), `previous.basis` saying which.
 */
export const GET = guardedRoute<{ id: string }>(ANY_ROLE, async ({ viewer, params }) => {
  const { audit, diagnostics, previous, machine } = await auditDiagnosticsFor(viewer, params);
  return Response.json({
    audit: {
      id: audit.id,
      title: audit.title,
      state: audit.state,
      fieldId: audit.field.id,
      fieldName: audit.field.name,
    },
    machine,
    diagnostics,
    previous,
  });
});
