import type { Role } from "@/lib/roles";

/**
 * The role values `member.role` and `invitation.role` may hold. Its keys must be exactly the roles of lib/roles.ts
 * (the compiler refuses a missing or an extra one), so the query layer needs no value from lib/.
 */
const STORED_ROLES: Record<Role, true> = { owner: true, qa_lead: true, technician: true, grower: true };

/** True when a stored role column holds one of our four roles. */
export function isStoredRole(value: unknown): value is Role {
  return typeof value === "string" && Object.hasOwn(STORED_ROLES, value);
}
