import {
  pgTable, text, timestamp, boolean, integer, doublePrecision, jsonb, uuid, bigint, index, uniqueIndex,
} from "drizzle-orm/pg-core";

// ---------------------------------------------------------------------------
// Accounts and organisations (better-auth core + organization plugin tables).
// Column names follow better-auth's field names so its drizzle adapter maps them 1:1.
// ---------------------------------------------------------------------------

export const user = pgTable("user", {
  id: text("id").primaryKey(),
  name: text("name").notNull(),
  email: text("email").notNull().unique(),
  emailVerified: boolean("email_verified").notNull().default(false),
  image: text("image"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

export const session = pgTable("session", {
  id: text("id").primaryKey(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  token: text("token").notNull().unique(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  ipAddress: text("ip_address"),
  userAgent: text("user_agent"),
  userId: text("user_id").notNull().references(() => user.id, { onDelete: "cascade" }),
  activeOrganizationId: text("active_organization_id"),
}, (t) => [index("session_user_idx").on(t.userId)]);

export const account = pgTable("account", {
  id: text("id").primaryKey(),
  accountId: text("account_id").notNull(),
  providerId: text("provider_id").notNull(),
  userId: text("user_id").notNull().references(() => user.id, { onDelete: "cascade" }),
  accessToken: text("access_token"),
  refreshToken: text("refresh_token"),
  idToken: text("id_token"),
  accessTokenExpiresAt: timestamp("access_token_expires_at", { withTimezone: true }),
  refreshTokenExpiresAt: timestamp("refresh_token_expires_at", { withTimezone: true }),
  scope: text("scope"),
  password: text("password"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("account_user_idx").on(t.userId)]);

export const verification = pgTable("verification", {
  id: text("id").primaryKey(),
  identifier: text("identifier").notNull(),
  value: text("value").notNull(),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("verification_identifier_idx").on(t.identifier)]);

/** A farm business or a field-services contractor. */
export const organization = pgTable("organization", {
  id: text("id").primaryKey(),
  name: text("name").notNull(),
  slug: text("slug").notNull().unique(),
  logo: text("logo"),
  metadata: text("metadata"),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
});

/** One role per member: owner, qa_lead, technician or grower (see lib/roles.ts). */
export const member = pgTable("member", {
  id: text("id").primaryKey(),
  organizationId: text("organization_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  userId: text("user_id").notNull().references(() => user.id, { onDelete: "cascade" }),
  role: text("role").notNull(),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [uniqueIndex("member_org_user_uq").on(t.organizationId, t.userId), index("member_user_idx").on(t.userId)]);

export const invitation = pgTable("invitation", {
  id: text("id").primaryKey(),
  organizationId: text("organization_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  email: text("email").notNull(),
  role: text("role"),
  status: text("status").notNull().default("pending"),
  expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
  inviterId: text("inviter_id").notNull().references(() => user.id, { onDelete: "cascade" }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("invitation_org_idx").on(t.organizationId), index("invitation_email_idx").on(t.email)]);

// ---------------------------------------------------------------------------
// Plotproof's own data. Every row carries org_id so every query can be scoped to one organisation.
// ---------------------------------------------------------------------------

/** A field of vegetable beds, with the projected CRS its records are audited in. */
export const field = pgTable("field", {
  id: uuid("id").primaryKey().defaultRandom(),
  orgId: text("org_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  name: text("name").notNull(),
  farm: text("farm").notNull(),
  /** EPSG code ("EPSG:25831") or a custom proj string. */
  crs: text("crs").notNull(),
  /** IANA zone for planting days, e.g. "Europe/Amsterdam". */
  timeZone: text("time_zone").notNull(),
  /** Degrees clockwise from grid north, 0–180; null = derive from the records. */
  rowBearingDeg: doublePrecision("row_bearing_deg"),
  bedSpacingM: doublePrecision("bed_spacing_m"),
  rowsPerBed: integer("rows_per_bed"),
  rowSpacingM: doublePrecision("row_spacing_m"),
  /** GeoJSON Polygon in WGS 84. */
  boundary: jsonb("boundary"),
  createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("field_org_idx").on(t.orgId), uniqueIndex("field_org_name_uq").on(t.orgId, t.name)]);

/** An uploaded file: the machine's as-planted records or a technician's survey. */
export const dataset = pgTable("dataset", {
  id: uuid("id").primaryKey().defaultRandom(),
  orgId: text("org_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  fieldId: uuid("field_id").notNull().references(() => field.id, { onDelete: "restrict" }),
  /** "planted" or "survey". */
  kind: text("kind").notNull(),
  fileName: text("file_name").notNull(),
  sha256: text("sha256").notNull(),
  sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
  rowCount: integer("row_count").notNull().default(0),
  crs: text("crs").notNull(),
  uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
  uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("dataset_org_field_idx").on(t.orgId, t.fieldId)]);

/** One comparison of a survey against as-planted records. */
export const audit = pgTable("audit", {
  id: uuid("id").primaryKey().defaultRandom(),
  orgId: text("org_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  fieldId: uuid("field_id").notNull().references(() => field.id, { onDelete: "restrict" }),
  plantedDatasetId: uuid("planted_dataset_id").references(() => dataset.id, { onDelete: "restrict" }),
  surveyDatasetId: uuid("survey_dataset_id").references(() => dataset.id, { onDelete: "restrict" }),
  title: text("title").notNull(),
  /** Lifecycle state; see lib/audit-states.ts once review lands. */
  state: text("state").notNull().default("draft"),
  settings: jsonb("settings"),
  summary: jsonb("summary"),
  createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
  createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("audit_org_field_idx").on(t.orgId, t.fieldId), index("audit_org_state_idx").on(t.orgId, t.state)]);

/** Who did what, when. Append-only. */
export const activity = pgTable("activity", {
  id: bigint("id", { mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
  orgId: text("org_id").notNull().references(() => organization.id, { onDelete: "cascade" }),
  actorId: text("actor_id").references(() => user.id, { onDelete: "set null" }),
  action: text("action").notNull(),
  subjectType: text("subject_type").notNull(),
  subjectId: text("subject_id"),
  detail: jsonb("detail"),
  at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
}, (t) => [index("activity_org_at_idx").on(t.orgId, t.at)]);
