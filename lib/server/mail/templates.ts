/** The messages Plotproof sends, as plain text with a simple HTML twin. Our own wording. Pure. */
import { ROLE_DUTY, ROLE_LABEL, type Role } from "@/lib/roles";

export type MailKind =
  | "invitation"
  | "password-reset"
  | "audit-submitted"
  | "audit-signed-off"
  | "audit-returned"
  | "audit-alert";

export interface MailContent {
  kind: MailKind;
  subject: string;
  text: string;
  html: string;
}

const esc = (s: string) => s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
const day = (d: Date) => d.toLocaleString("en-GB", { dateStyle: "long", timeStyle: "short", timeZone: "UTC" }) + " UTC";

/** Paragraphs of text; a paragraph that is a bare URL becomes a button-like link in HTML. */
function compose(kind: MailKind, subject: string, paragraphs: string[]): MailContent {
  const text = paragraphs.join("\n\n") + "\n\n— Plotproof\n";
  const body = paragraphs
    .map((p) =>
      /^https?:\/\/\S+$/.test(p)
        ? `<p><a href="${esc(p)}" style="display:inline-block;background:#2f6b45;color:#fff;padding:8px 14px;border-radius:3px;text-decoration:none">${esc(p)}</a></p>`
        : `<p>${esc(p).replace(/\n/g, "<br>")}</p>`,
    )
    .join("\n");
  const html = `<!doctype html><html><body style="font-family:Inter,system-ui,sans-serif;color:#1d2a24;background:#f6f4ee;padding:16px">
<div style="max-width:560px;margin:auto;background:#fff;border:1px solid #d9d3c4;border-radius:3px;padding:20px">
${body}
<p style="color:#7b8781;font-size:12px">— Plotproof</p></div></body></html>`;
  return { kind, subject, text, html };
}

export function invitationMail(p: {
  orgName: string;
  inviterName: string;
  role: Role;
  link: string;
  expiresAt: Date;
}): MailContent {
  return compose("invitation", `Join ${p.orgName} on Plotproof`, [
    `${p.inviterName} has invited you to join ${p.orgName} on Plotproof as ${ROLE_LABEL[p.role]}. ${ROLE_DUTY[p.role]}`,
    "Open this link to accept and set your password (or sign in, if you already have a Plotproof account):",
    p.link,
    `The invitation works until ${day(p.expiresAt)}. If you did not expect it, ignore this message.`,
  ]);
}

export function passwordResetMail(p: { name: string; link: string; validMinutes: number }): MailContent {
  return compose("password-reset", "Set a new Plotproof password", [
    `Hello ${p.name},`,
    "Someone asked to set a new password for your Plotproof account. If it was you, open this link:",
    p.link,
    `The link works for ${p.validMinutes} minutes and only once. If you did not ask, ignore this message; your password stays as it is.`,
  ]);
}

export interface AuditMailFacts {
  title: string;
  fieldName: string;
  orgName: string;
  revision: number;
  link: string;
}

export function auditSubmittedMail(
  a: AuditMailFacts & { submitterName: string; note: string | null; passed: boolean | null },
): MailContent {
  return compose(
    "audit-submitted",
    `Waiting for your sign-off: ${a.title}`,
    [
      `${a.submitterName} has submitted the audit “${a.title}” of ${a.fieldName} (revision ${a.revision}) for sign-off.`,
      a.passed === null
        ? ""
        : a.passed
          ? "Every criterion of its tolerance profile passed."
          : "Some criteria of its tolerance profile failed; signing it off would accept it with deviation.",
      a.note ? `Their note: “${a.note}”` : "",
      "Review it here:",
      a.link,
    ].filter(Boolean),
  );
}

export function auditSignedOffMail(
  a: AuditMailFacts & {
    signerName: string;
    deviation: boolean;
    comment: string | null;
    sha256: string;
    reportLink: string;
  },
): MailContent {
  return compose(
    "audit-signed-off",
    `Signed off: ${a.title}`,
    [
      `${a.signerName} has signed off the audit “${a.title}” of ${a.fieldName} (revision ${a.revision})${a.deviation ? " with deviation" : ""}.`,
      a.comment ? `Comment: “${a.comment}”` : "",
      `Its inputs and results are now fixed; their SHA-256 is ${a.sha256}.`,
      "The audit:",
      a.link,
      "The printable sign-off report:",
      a.reportLink,
      "The sign-off certifies how accurate the plant records are, not that a machine is safe to run.",
    ].filter(Boolean),
  );
}

export function auditReturnedMail(
  a: AuditMailFacts & { returnerName: string; reasons: string[]; comment: string },
): MailContent {
  return compose("audit-returned", `Returned for correction: ${a.title}`, [
    `${a.returnerName} has returned the audit “${a.title}” of ${a.fieldName} (revision ${a.revision}) for correction.`,
    `Reasons:\n${a.reasons.map((r) => `• ${r}`).join("\n")}`,
    `Comment: “${a.comment}”`,
    "Correct it and start a new revision here:",
    a.link,
  ]);
}

/** Alerts (issue 13): the organisation's thresholds an audit breached when it was computed. */
export function auditAlertMail(
  a: AuditMailFacts & { machineName: string | null; breaches: string[]; alertsLink: string },
): MailContent {
  return compose(
    "audit-alert",
    `Alert: ${a.title} crossed ${a.breaches.length === 1 ? "a threshold" : `${a.breaches.length} thresholds`}`,
    [
      `The audit “${a.title}” of ${a.fieldName}${a.machineName ? ` (machine ${a.machineName})` : ""} has been computed and crossed the alert thresholds ${a.orgName} set:`,
      a.breaches.map((b) => `• ${b}`).join("\n"),
      "The audit's diagnostics:",
      a.link,
      "All alerts:",
      a.alertsLink,
      "An alert says the records need a look before the next operation; it does not stop anything. Follow your own safety rules before working near the machine.",
    ],
  );
}
