/** The four roles of an organisation member. One role per member. */
export const ROLES = ["owner", "qa_lead", "technician", "grower"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABEL: Record<Role, string> = {
  owner: "Owner",
  qa_lead: "QA lead",
  technician: "Technician",
  grower: "Grower",
};

export const ROLE_DUTY: Record<Role, string> = {
  owner: "Runs the organisation: team, roles and API keys.",
  qa_lead: "Reviews audits and signs them off or returns them.",
  technician: "Sets up fields, uploads as-planted and survey files, runs audits.",
  grower: "Reads where the records can be trusted before the next pass.",
};

/** Who may create fields, upload files and run audits. */
export const CAN_PREPARE: readonly Role[] = ["owner", "qa_lead", "technician"];
/** Who may edit tolerance profiles and sign audits off. */
export const CAN_REVIEW: readonly Role[] = ["owner", "qa_lead"];
/** Everyone in the organisation may read. */
export const ANY_ROLE: readonly Role[] = ROLES;

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
