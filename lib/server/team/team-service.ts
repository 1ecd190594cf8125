import "server-only";
import { isAPIError } from "better-auth/api";
import { getAuth } from "@/lib/server/auth";
import { getDb } from "@/db/client";
import { latestActivityFor, logActivity } from "@/db/queries/activity";
import { getInvitationInOrg, getMemberInOrg, listInvitations, type InvitationRow } from "@/db/queries/team";
import { bearerKey } from "@/lib/server/api-keys";
import { AppError, notFound } from "@/lib/errors";
import { invitationLink } from "@/lib/server/mail/notify";
import type { Viewer } from "@/lib/server/access";
import type { Role } from "@/lib/roles";
import type { InvitationDto } from "@/lib/review/types";

/** better-auth's organisation endpoints act for the signed-in person, so team changes need a session, not an API key. */
export function requireBrowserSession(req: Request): void {
  if (bearerKey(req.headers))
    throw new AppError(
      "forbidden",
      "Team changes need an owner signed in to Plotproof; API keys cannot change the team.",
    );
}

export function toInvitationDto(r: InvitationRow): InvitationDto {
  return {
    id: r.id,
    email: r.email,
    role: r.role,
    status: r.status,
    expiresAt: r.expiresAt.toISOString(),
    invitedBy: r.invitedBy,
    createdAt: r.createdAt.toISOString(),
    link: invitationLink(r.id),
  };
}

export async function invitationsOf(orgId: string): Promise<InvitationDto[]> {
  return (await listInvitations(await getDb(), { orgId })).map(toInvitationDto);
}

/** better-auth's refusals in our words and status codes. */
function translate(err: unknown): never {
  if (!isAPIError(err)) throw err;
  const code = String((err.body as { code?: string } | undefined)?.code ?? "");
  const message = String((err.body as { message?: string } | undefined)?.message ?? err.message);
  if (code.includes("ALREADY_A_MEMBER"))
    throw new AppError("conflict", "This person is already a member of the organisation.");
  if (code.includes("ALREADY_INVITED"))
    throw new AppError(
      "conflict",
      "This address already has a pending invitation; send it again from the list instead.",
    );
  if (code.includes("WITHOUT_AN_OWNER") || code.includes("ONLY_OWNER"))
    throw new AppError("conflict", "An organisation needs at least one owner: make someone else owner first.");
  if (code.includes("INVITATION_NOT_FOUND")) throw notFound("Invitation");
  if (code.includes("MEMBER_NOT_FOUND")) throw notFound("Member");
  if (code.includes("INVALID_EMAIL"))
    throw new AppError("invalid_input", "Enter a valid e-mail address.", [
      { path: ["email"], message: "Enter a valid e-mail address." },
    ]);
  if (err.statusCode === 401) throw new AppError("unauthenticated", "Sign in to continue.");
  if (err.statusCode === 403) throw new AppError("forbidden", message);
  throw new AppError("invalid_input", message);
}

async function mailOutcome(orgId: string, invitationId: string): Promise<"sent" | "failed" | "skipped" | null> {
  const row = await latestActivityFor(await getDb(), {
    orgId,
    subjectId: invitationId,
    actions: ["mail.sent", "mail.failed", "mail.skipped"],
  });
  return row ? (row.action.slice(5) as "sent" | "failed" | "skipped") : null;
}

export async function invite(
  req: Request,
  viewer: Viewer,
  input: { email: string; role: Role; resend?: boolean },
): Promise<{ invitation: InvitationDto; mail: "sent" | "failed" | "skipped" | null }> {
  const auth = await getAuth();
  let created: { id: string };
  try {
    created = await auth.api.createInvitation({
      headers: req.headers,
      body: {
        email: input.email.toLowerCase(),
        role: input.role,
        organizationId: viewer.orgId,
        ...(input.resend ? { resend: true } : {}),
      },
    });
  } catch (err) {
    translate(err);
  }
  const db = await getDb();
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: input.resend ? "invitation.resent" : "member.invited",
    subjectType: "invitation",
    subjectId: created.id,
    detail: { email: input.email.toLowerCase(), role: input.role },
  });
  const row = await getInvitationInOrg(db, { id: created.id, orgId: viewer.orgId });
  if (!row) throw notFound("Invitation");
  return { invitation: toInvitationDto(row), mail: await mailOutcome(viewer.orgId, created.id) };
}

export async function resend(req: Request, viewer: Viewer, id: string) {
  const row = await getInvitationInOrg(await getDb(), { id, orgId: viewer.orgId });
  if (!row) throw notFound("Invitation");
  if (row.status !== "pending" && row.status !== "expired")
    throw new AppError("conflict", `This invitation was ${row.status}; invite the person again instead.`);
  if (row.status === "expired") {
    // better-auth only re-sends pending invitations that have not run out; an expired one is replaced by a new one.
    return invite(req, viewer, { email: row.email, role: row.role });
  }
  return invite(req, viewer, { email: row.email, role: row.role, resend: true });
}

export async function cancel(req: Request, viewer: Viewer, id: string): Promise<void> {
  const db = await getDb();
  const row = await getInvitationInOrg(db, { id, orgId: viewer.orgId });
  if (!row) throw notFound("Invitation");
  if (row.status !== "pending" && row.status !== "expired")
    throw new AppError("conflict", `This invitation was already ${row.status}.`);
  try {
    await (await getAuth()).api.cancelInvitation({ headers: req.headers, body: { invitationId: id } });
  } catch (err) {
    translate(err);
  }
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "invitation.canceled",
    subjectType: "invitation",
    subjectId: id,
    detail: { email: row.email },
  });
}

export async function changeRole(req: Request, viewer: Viewer, memberId: string, role: Role) {
  const db = await getDb();
  const m = await getMemberInOrg(db, { memberId, orgId: viewer.orgId });
  if (!m) throw notFound("Member");
  if (m.role !== role) {
    try {
      await (await getAuth()).api.updateMemberRole({
        headers: req.headers,
        body: { memberId, role, organizationId: viewer.orgId },
      });
    } catch (err) {
      translate(err);
    }
    await logActivity(db, {
      orgId: viewer.orgId,
      actorId: viewer.userId,
      action: "member.role_changed",
      subjectType: "member",
      subjectId: memberId,
      detail: { name: m.name, from: m.role, to: role },
    });
  }
  return { ...m, role };
}

export async function remove(req: Request, viewer: Viewer, memberId: string): Promise<void> {
  const db = await getDb();
  const m = await getMemberInOrg(db, { memberId, orgId: viewer.orgId });
  if (!m) throw notFound("Member");
  try {
    await (await getAuth()).api.removeMember({
      headers: req.headers,
      body: { memberIdOrEmail: memberId, organizationId: viewer.orgId },
    });
  } catch (err) {
    translate(err);
  }
  await logActivity(db, {
    orgId: viewer.orgId,
    actorId: viewer.userId,
    action: "member.removed",
    subjectType: "member",
    subjectId: memberId,
    detail: { name: m.name, email: m.email, role: m.role },
  });
}
