import "server-only";
import { and, asc, eq } from "drizzle-orm";
import type { DB } from "@/db/client";
import { member, organization, user } from "@/db/schema";
import type { Role } from "@/lib/roles";
import { isStoredRole } from "@/db/roles";

export interface Membership {
  orgId: string;
  orgName: string;
  role: Role;
}

/**
 * The organisation and role a user acts in: the session's active organisation when set,
 * otherwise the user's first membership.
 */
export async function getMembershipForUser(
  db: DB,
  { userId, activeOrgId }: { userId: string; activeOrgId?: string | null },
): Promise<Membership | null> {
  const rows = await db
    .select({ orgId: member.organizationId, orgName: organization.name, role: member.role })
    .from(member)
    .innerJoin(organization, eq(organization.id, member.organizationId))
    .where(eq(member.userId, userId))
    .orderBy(asc(member.createdAt));
  const row = rows.find((r) => r.orgId === activeOrgId) ?? rows[0];
  if (!row || !isStoredRole(row.role)) return null;
  return { orgId: row.orgId, orgName: row.orgName, role: row.role };
}

export interface TeamMemberDto {
  memberId: string;
  name: string;
  email: string;
  role: Role;
  joinedAt: string;
}

export async function listTeamMembers(db: DB, { orgId }: { orgId: string }): Promise<TeamMemberDto[]> {
  const rows = await db
    .select({ memberId: member.id, name: user.name, email: user.email, role: member.role, joinedAt: member.createdAt })
    .from(member)
    .innerJoin(user, eq(user.id, member.userId))
    .where(eq(member.organizationId, orgId))
    .orderBy(asc(user.name));
  return rows
    .filter((r) => isStoredRole(r.role))
    .map((r) => ({ ...r, role: r.role as Role, joinedAt: r.joinedAt.toISOString() }));
}

export async function setMemberRole(db: DB, { orgId, userId, role }: { orgId: string; userId: string; role: Role }) {
  await db
    .update(member)
    .set({ role })
    .where(and(eq(member.organizationId, orgId), eq(member.userId, userId)));
}
