import "server-only";
import { getDb } from "@/db/client";
import { getAuditForReview, getSignoff, lastSubmitterId, userName } from "@/db/queries/review";
import { getOrganisationName, listMembersWithRoles, type MemberRow } from "@/db/queries/team";
import { isRole, MAILED_ON_DECISION, MAILED_ON_SUBMIT } from "@/lib/roles";
import { RETURN_REASONS, type ReturnReason } from "@/lib/review/return-reasons";
import { mailConfig } from "./config";
import { deliver, type Delivery } from "./send";
import {
  auditReturnedMail,
  auditSignedOffMail,
  auditSubmittedMail,
  invitationMail,
  passwordResetMail,
} from "./templates";

/** The link an invitee opens. */
export function invitationLink(invitationId: string): string {
  return `${mailConfig().appUrl}/invite/${encodeURIComponent(invitationId)}`;
}

/** better-auth's organisation plugin calls this for every new or re-sent invitation. */
export async function sendInvitationMail(data: {
  id: string;
  role: string;
  email: string;
  organization: { id: string; name: string };
  inviter: { user: { name: string } };
  invitation: { expiresAt: Date };
}): Promise<Delivery> {
  if (!isRole(data.role)) return { status: "skipped", error: `unknown role ${data.role}` };
  const mail = invitationMail({
    orgName: data.organization.name,
    inviterName: data.inviter.user.name,
    role: data.role,
    link: invitationLink(data.id),
    expiresAt: new Date(data.invitation.expiresAt),
  });
  return deliver(mail, [data.email], { orgId: data.organization.id, subject: { type: "invitation", id: data.id } });
}

/** better-auth calls this when someone asks to reset their password; `url` carries the one-time token. */
export async function sendPasswordResetMail(
  data: { user: { name: string; email: string }; url: string },
  validMinutes: number,
): Promise<Delivery> {
  return deliver(passwordResetMail({ name: data.user.name, link: data.url, validMinutes }), [data.user.email], {
    orgId: null,
  });
}

async function facts(auditId: string, orgId: string) {
  const db = await getDb();
  const a = await getAuditForReview(db, { id: auditId, orgId });
  const orgName = await getOrganisationName(db, { orgId });
  if (!a || !orgName) return null;
  const base = mailConfig().appUrl;
  return {
    db,
    audit: a,
    base,
    facts: {
      title: a.title,
      fieldName: a.fieldName,
      orgName,
      revision: a.revision,
      link: `${base}/audits/${a.id}/review`,
    },
  };
}

/** "Waiting for your sign-off" to the organisation's QA leads (its owners when it has none). */
export async function notifySubmitted({
  auditId,
  orgId,
  submitterName,
  note,
}: {
  auditId: string;
  orgId: string;
  submitterName: string;
  note: string | null;
}): Promise<Delivery> {
  const f = await facts(auditId, orgId);
  if (!f) return { status: "skipped", error: "audit not found" };
  let to: MemberRow[] = [];
  for (const roles of MAILED_ON_SUBMIT) {
    to = await listMembersWithRoles(f.db, { orgId, roles });
    if (to.length > 0) break;
  }
  const mail = auditSubmittedMail({ ...f.facts, submitterName, note, passed: f.audit.verdict?.passed ?? null });
  return deliver(
    mail,
    to.map((m) => m.email),
    { orgId, subject: { type: "audit", id: auditId } },
  );
}

/** "Signed off" or "Returned" to whoever submitted the audit and to the organisation's growers. */
export async function notifyDecision(
  d:
    | { auditId: string; orgId: string; decision: "signed_off" }
    | {
        auditId: string;
        orgId: string;
        decision: "returned";
        returnerName: string;
        reasons: ReturnReason[];
        comment: string;
      },
): Promise<Delivery> {
  const f = await facts(d.auditId, d.orgId);
  if (!f) return { status: "skipped", error: "audit not found" };
  const growers = await listMembersWithRoles(f.db, { orgId: d.orgId, roles: MAILED_ON_DECISION });
  const submitterId = await lastSubmitterId(f.db, { auditId: d.auditId, orgId: d.orgId });
  const submitter = submitterId ? await userName(f.db, { userId: submitterId }) : null;
  const to = [...(submitter ? [submitter.email] : []), ...growers.map((g) => g.email)];
  if (d.decision === "signed_off") {
    const s = await getSignoff(f.db, { auditId: d.auditId, orgId: d.orgId });
    if (!s) return { status: "skipped", error: "no sign-off" };
    const mail = auditSignedOffMail({
      ...f.facts,
      signerName: s.signerName,
      deviation: s.deviation,
      comment: s.comment,
      sha256: s.sha256,
      reportLink: `${f.base}/audits/${d.auditId}/report`,
    });
    return deliver(mail, to, { orgId: d.orgId, subject: { type: "audit", id: d.auditId } });
  }
  const mail = auditReturnedMail({
    ...f.facts,
    returnerName: d.returnerName,
    reasons: d.reasons.map((r) => RETURN_REASONS[r]),
    comment: d.comment,
  });
  return deliver(mail, to, { orgId: d.orgId, subject: { type: "audit", id: d.auditId } });
}
