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

// Who may do what: route handlers (`guardedRoute`), pages (`requirePageViewer`), the navigation, the review
// lifecycle and the e-mails all take their role lists from here. `lib/roles.test.ts` pins the table.

/** Everyone in the organisation may read its fields, audits, reports and activity. */
export const ANY_ROLE: readonly Role[] = ROLES;
/** Create and edit fields, upload and delete files, save column presets, run audits, submit and revise them. */
export const CAN_PREPARE: readonly Role[] = ["owner", "qa_lead", "technician"];
/** Review submitted audits: sign them off or return them for correction; the review queue. */
export const CAN_REVIEW: readonly Role[] = ["owner", "qa_lead"];
/** Create, edit and delete tolerance profiles. */
export const CAN_EDIT_PROFILES: readonly Role[] = ["owner", "qa_lead"];
/** Plan check surveys (which plants, stakeout files) and keep a field's control marks. */
export const CAN_PLAN_SURVEYS: readonly Role[] = ["owner", "qa_lead"];
/** Invite people, change roles, remove members; see team and API key changes in the activity log. */
export const CAN_MANAGE_TEAM: readonly Role[] = ["owner"];
/** Create, list and revoke API keys. */
export const CAN_MANAGE_KEYS: readonly Role[] = ["owner"];
/** Read the outbox of e-mails the organisation sent. */
export const CAN_READ_OUTBOX: readonly Role[] = ["owner"];

/** Create, edit and delete the organisation's planting machines (everyone reads them; uploads name them). */
export const CAN_MANAGE_MACHINES: readonly Role[] = ["owner", "qa_lead"];
/** Set the organisation's alert thresholds and acknowledge alerts. */
export const CAN_SET_ALERTS: readonly Role[] = ["owner", "qa_lead"];

/** The named permissions, for `can` and for the test that pins them. */
export const PERMISSIONS = {
  ANY_ROLE,
  CAN_PREPARE,
  CAN_REVIEW,
  CAN_EDIT_PROFILES,
  CAN_PLAN_SURVEYS,
  CAN_MANAGE_TEAM,
  CAN_MANAGE_KEYS,
  CAN_READ_OUTBOX,
  CAN_MANAGE_MACHINES,
  CAN_SET_ALERTS,
} as const;
export type Permission = keyof typeof PERMISSIONS;

/** May `role` do what `permission` allows? */
export function can(role: Role, permission: Permission): boolean {
  return PERMISSIONS[permission].includes(role);
}

// Who is told by e-mail (lib/server/mail/notify.ts).

/** "Waiting for your sign-off" goes to the QA leads; to the owners when the organisation has no QA lead. */
export const MAILED_ON_SUBMIT: readonly (readonly Role[])[] = [["qa_lead"], ["owner"]];
/** "Signed off" and "Returned" go to the submitter and to these roles. */
export const MAILED_ON_DECISION: readonly Role[] = ["grower"];

/** Alerts (a computed audit breaching the organisation's thresholds) go to these roles. */
export const MAILED_ON_ALERT: readonly Role[] = ["owner", "qa_lead"];

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
