/** One plain sentence per activity entry, our own wording. Pure. */
import { ROLE_LABEL, isRole } from "@/lib/roles";
import { RETURN_REASONS, type ReturnReason } from "./return-reasons";

type Detail = Record<string, unknown> | null;

const str = (v: unknown) => (typeof v === "string" ? v : v === null || v === undefined ? "" : String(v));
const q = (v: unknown) => `“${str(v)}”`;
const role = (v: unknown) => (isRole(v) ? ROLE_LABEL[v] : str(v));
const rev = (d: Detail) => (d && typeof d.revision === "number" ? ` revision ${d.revision}` : "");

/**
 * @example activityText("dataset.uploaded", "Tamsin Rook", { fileName: "a.csv", kind: "survey", rows: 381 })
 *   // "Tamsin Rook uploaded a.csv (survey, 381 rows)."
 */
export function activityText(action: string, actorName: string | null, detail: unknown): string {
  const d = (detail && typeof detail === "object" ? detail : null) as Detail;
  const who = actorName ?? "Plotproof";
  switch (action) {
    case "organisation.created":
      return `${who} set up the organisation ${q(d?.name)}.`;
    case "field.created":
      return `${who} created the field ${q(d?.name)}.`;
    case "field.updated":
      return `${who} changed the field (${Array.isArray(d?.changed) ? (d!.changed as string[]).join(", ") : "settings"}).`;
    case "dataset.uploaded":
      return `${who} uploaded ${str(d?.fileName)} (${d?.kind === "planted" ? "as-planted records" : "survey"}, ${str(d?.rows)} rows).`;
    case "dataset.deleted":
      return `${who} deleted ${str(d?.fileName)}.`;
    case "profile.created":
      return `${who} created the tolerance profile ${q(d?.name)}.`;
    case "profile.updated":
      return `${who} changed a tolerance profile.`;
    case "profile.deleted":
      return `${who} deleted a tolerance profile.`;
    case "audit.created":
      return `${who} started the audit ${q(d?.title)}.`;
    case "audit.computed":
      return `The audit was computed: ${str(d?.pairs)} pairs, ${d?.passed ? "passed" : "did not pass"} its profile.`;
    case "audit.failed":
      return `The audit could not be computed: ${str(d?.error)}`;
    case "audit.resumed":
      return `The server stopped while the audit was computing (stage ${str(d?.stage)}); it was started again${d?.resumption ? ` (${str(d.resumption)} of ${str(d.limit)})` : ""}.`;
    case "audit.recomputed":
      return `${who} started the failed audit again with the same files and settings.`;
    case "report.downloaded":
      return `${who} downloaded the ${str(d?.kind)} CSV.`;
    case "report.opened":
      return `${who} opened the printable sign-off report.`;
    case "audit.submitted":
      return `${who} submitted${rev(d)} for sign-off${d?.note ? `: ${q(d.note)}` : "."}`;
    case "audit.returned": {
      const reasons = Array.isArray(d?.reasons)
        ? (d!.reasons as ReturnReason[]).map((r) => RETURN_REASONS[r] ?? r).join("; ")
        : "";
      return `${who} returned${rev(d)} for correction${reasons ? ` (${reasons})` : ""}.`;
    }
    case "audit.signed_off":
      return `${who} signed off${rev(d)}${d?.deviation ? " with deviation" : ""} (SHA-256 ${str(d?.sha256).slice(0, 12)}…).`;
    case "audit.revised":
      return `${who} started revision ${str(d?.newRevision)} to correct it.`;
    case "audit.verified":
      return d?.ok
        ? `${who} verified it: figures and hash match.`
        : `${who} verified it: MISMATCH (${str(d?.failed)}).`;
    case "member.invited":
      return `${who} invited ${str(d?.email)} as ${role(d?.role)}.`;
    case "invitation.resent":
      return `${who} sent the invitation to ${str(d?.email)} again.`;
    case "invitation.canceled":
      return `${who} withdrew the invitation to ${str(d?.email)}.`;
    case "invitation.accepted":
      return `${who} joined as ${role(d?.role)}.`;
    case "member.role_changed":
      return `${who} changed ${str(d?.name)}’s role from ${role(d?.from)} to ${role(d?.to)}.`;
    case "member.removed":
      return `${who} removed ${str(d?.name)} from the organisation.`;
    case "mail.sent":
      return `E-mail ${q(d?.subject)} sent to ${str(d?.recipients)} recipient(s).`;
    case "mail.failed":
      return `E-mail ${q(d?.subject)} could not be sent: ${str(d?.error)}`;
    case "mail.skipped":
      return `E-mail ${q(d?.subject)} was not sent: no SMTP server is configured.`;
    case "api_key.created":
      return `${who} created the API key ${q(d?.name)}.`;
    case "api_key.revoked":
      return `${who} revoked an API key.`;
    default:
      return `${who}: ${action}.`;
  }
}

/** The page of an activity's subject, if any. */
export function activityHref(subjectType: string, subjectId: string | null): string | null {
  if (!subjectId) return null;
  if (subjectType === "audit") return `/audits/${subjectId}/review`;
  if (subjectType === "field") return `/fields/${subjectId}`;
  return null;
}
