import "server-only";
import { and, asc, desc, eq, inArray } from "drizzle-orm";
import type { DB } from "@/db/client";
import { invitation, member, organization, user } from "@/db/schema";
import type { Role } from "@/lib/roles";
import { isStoredRole } from "@/db/roles";

export interface InvitationRow {
  id: string;
  orgId: string;
  orgName: string;
  email: string;
  role: Role;
  status: "pending" | "accepted" | "canceled" | "rejected" | "expired";
  expiresAt: Date;
  invitedBy: string | null;
  createdAt: Date;
}

function toRow(
  r: {
    id: string;
    orgId: string;
    orgName: string;
    email: string;
    role: string | null;
    status: string;
    expiresAt: Date;
    invitedBy: string | null;
    createdAt: Date;
  },
  now: Date,
): InvitationRow | null {
  if (!isStoredRole(r.role)) return null;
  const status = r.status === "pending" && r.expiresAt < now ? "expired" : (r.status as InvitationRow["status"]);
  return { ...r, role: r.role, status };
}

const invitationCols = {
  id: invitation.id,
  orgId: invitation.organizationId,
  orgName: organization.name,
  email: invitation.email,
  role: invitation.role,
  status: invitation.status,
  expiresAt: invitation.expiresAt,
  invitedBy: user.name,
  createdAt: invitation.createdAt,
};

/** Invitations of an organisation, newest first ("expired" when a pending one has run out). */
export async function listInvitations(
  db: DB,
  { orgId, now = new Date() }: { orgId: string; now?: Date },
): Promise<InvitationRow[]> {
  const rows = await db
    .select(invitationCols)
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .leftJoin(user, eq(user.id, invitation.inviterId))
    .where(eq(invitation.organizationId, orgId))
    .orderBy(desc(invitation.createdAt))
    .limit(200);
  return rows.map((r) => toRow(r, now)).filter((r): r is InvitationRow => r !== null);
}

/** One invitation by its (unguessable) id, for the public invitation page. */
export async function getInvitation(
  db: DB,
  { id, now = new Date() }: { id: string; now?: Date },
): Promise<InvitationRow | null> {
  const [row] = await db
    .select(invitationCols)
    .from(invitation)
    .innerJoin(organization, eq(organization.id, invitation.organizationId))
    .leftJoin(user, eq(user.id, invitation.inviterId))
    .where(eq(invitation.id, id));
  return row ? toRow(row, now) : null;
}

export async function getInvitationInOrg(
  db: DB,
  { id, orgId }: { id: string; orgId: string },
): Promise<InvitationRow | null> {
  const row = await getInvitation(db, { id });
  return row && row.orgId === orgId ? row : null;
}

export async function userExistsWithEmail(db: DB, { email }: { email: string }): Promise<boolean> {
  const [row] = await db.select({ id: user.id }).from(user).where(eq(user.email, email.toLowerCase()));
  return !!row;
}

export interface MemberRow {
  memberId: string;
  userId: string;
  name: string;
  email: string;
  role: Role;
}

export async function getMemberInOrg(
  db: DB,
  { memberId, orgId }: { memberId: string; orgId: string },
): Promise<MemberRow | null> {
  const [row] = await db
    .select({ memberId: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.id, memberId), eq(member.organizationId, orgId)));
  return row && isStoredRole(row.role) ? { ...row, role: row.role } : null;
}

/** Members with one of the roles (e-mail recipients). */
export async function listMembersWithRoles(
  db: DB,
  { orgId, roles }: { orgId: string; roles: readonly Role[] },
): Promise<MemberRow[]> {
  const rows = await db
    .select({ memberId: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.organizationId, orgId), inArray(member.role, roles)))
    .orderBy(asc(user.name));
  return rows.filter((r) => isStoredRole(r.role)).map((r) => ({ ...r, role: r.role as Role }));
}

export async function getMemberByUser(
  db: DB,
  { userId, orgId }: { userId: string; orgId: string },
): Promise<MemberRow | null> {
  const [row] = await db
    .select({ memberId: member.id, userId: member.userId, name: user.name, email: user.email, role: member.role })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(and(eq(member.userId, userId), eq(member.organizationId, orgId)));
  return row && isStoredRole(row.role) ? { ...row, role: row.role } : null;
}

export async function getOrganisationName(db: DB, { orgId }: { orgId: string }): Promise<string | null> {
  const [row] = await db.select({ name: organization.name }).from(organization).where(eq(organization.id, orgId));
  return row?.name ?? null;
}
