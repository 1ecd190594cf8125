import {
  pgTable,
  text,
  timestamp,
  boolean,
  integer,
  doublePrecision,
  jsonb,
  uuid,
  bigint,
  index,
  uniqueIndex,
  primaryKey,
  customType,
  real,
  check,
  type AnyPgColumn,
} from "drizzle-orm/pg-core";
import { sql } from "drizzle-orm";
import type { ApiKeyScope } from "@/lib/security/key-scope";

/** Raw bytes (uploaded files, columnar point blobs). */
const bytea = customType<{ data: Uint8Array; driverData: Uint8Array }>({ dataType: () => "bytea" });

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

export const session = pgTable(
  "session",
  {
    id: text("id").primaryKey(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    token: text("token").notNull().unique(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    ipAddress: text("ip_address"),
    userAgent: text("user_agent"),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    activeOrganizationId: text("active_organization_id"),
  },
  (t) => [index("session_user_idx").on(t.userId)],
);

export const account = pgTable(
  "account",
  {
    id: text("id").primaryKey(),
    accountId: text("account_id").notNull(),
    providerId: text("provider_id").notNull(),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    accessToken: text("access_token"),
    refreshToken: text("refresh_token"),
    idToken: text("id_token"),
    accessTokenExpiresAt: timestamp("access_token_expires_at", { withTimezone: true }),
    refreshTokenExpiresAt: timestamp("refresh_token_expires_at", { withTimezone: true }),
    scope: text("scope"),
    password: text("password"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("account_user_idx").on(t.userId)],
);

export const verification = pgTable(
  "verification",
  {
    id: text("id").primaryKey(),
    identifier: text("identifier").notNull(),
    value: text("value").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("verification_identifier_idx").on(t.identifier)],
);

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
export const member = pgTable(
  "member",
  {
    id: text("id").primaryKey(),
    organizationId: text("organization_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    role: text("role").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("member_org_user_uq").on(t.organizationId, t.userId), index("member_user_idx").on(t.userId)],
);

export const invitation = pgTable(
  "invitation",
  {
    id: text("id").primaryKey(),
    organizationId: text("organization_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: text("role"),
    status: text("status").notNull().default("pending"),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    inviterId: text("inviter_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("invitation_org_idx").on(t.organizationId), index("invitation_email_idx").on(t.email)],
);

// ---------------------------------------------------------------------------
// Plotproof's own data. Every row carries org_id so every query can be scoped to one organisation.
// ---------------------------------------------------------------------------

/** A field of vegetable beds, with the projected CRS its records are audited in. */
export const field = pgTable(
  "field",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
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
  },
  (t) => [index("field_org_idx").on(t.orgId), uniqueIndex("field_org_name_uq").on(t.orgId, t.name)],
);

/** An uploaded file: the machine's as-planted records or a technician's survey. */
export const dataset = pgTable(
  "dataset",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    fieldId: uuid("field_id")
      .notNull()
      .references(() => field.id, { onDelete: "restrict" }),
    /** "planted" or "survey". */
    kind: text("kind").notNull(),
    fileName: text("file_name").notNull(),
    sha256: text("sha256").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    rowCount: integer("row_count").notNull().default(0),
    crs: text("crs").notNull(),
    /** "csv" or "geojson". */
    format: text("format").notNull().default("csv"),
    /** The column mapping the file was read with (guessed, corrected or from a preset). */
    mapping: jsonb("mapping"),
    /** Warnings the uploader accepted when saving. */
    acceptedWarnings: jsonb("accepted_warnings"),
    /** Parsed points, columnar (see db/points-blob.ts), in the file's own CRS. */
    points: bytea("points"),
    uploadedBy: text("uploaded_by").references(() => user.id, { onDelete: "set null" }),
    uploadedAt: timestamp("uploaded_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("dataset_org_field_idx").on(t.orgId, t.fieldId)],
);

/**
 * The uploaded file exactly as received, kept apart so listings never load it. Embedded mode keeps the bytes here;
 * server mode with an object store keeps them there under a write-once key (lib/server/storage), size and SHA-256
 * staying on the dataset row. Exactly one of the two is set.
 */
export const datasetFile = pgTable(
  "dataset_file",
  {
    datasetId: uuid("dataset_id")
      .primaryKey()
      .references(() => dataset.id, { onDelete: "restrict" }),
    contentType: text("content_type").notNull(),
    bytes: bytea("bytes"),
    /** Key of the object holding the bytes (object storage), never reused or overwritten. */
    objectKey: text("object_key"),
  },
  (t) => [check("dataset_file_bytes_or_object", sql`(${t.bytes} is null) <> (${t.objectKey} is null)`)],
);

/**
 * Named limits tied to the operation that will use the records. Lengths in metres; a null limit is not checked.
 * Audits keep a copy of the profile they were computed with, so editing a profile never changes a past verdict.
 */
export const toleranceProfile = pgTable(
  "tolerance_profile",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    operation: text("operation").notNull(),
    radialM: doublePrecision("radial_m"),
    crossM: doublePrecision("cross_m"),
    alongM: doublePrecision("along_m"),
    /** Share of checkpoints that must be within all limits, 0–1 (tested on the lower confidence bound). */
    requiredShare: doublePrecision("required_share").notNull(),
    confidence: doublePrecision("confidence").notNull().default(0.95),
    minCheckpoints: integer("min_checkpoints").notNull(),
    /** Seeded starting values (common practice, not a standard). */
    builtIn: boolean("built_in").notNull().default(false),
    note: text("note"),
    updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("profile_org_name_uq").on(t.orgId, t.name)],
);

/** A saved column mapping, offered the next time a similar file is uploaded. */
export const importPreset = pgTable(
  "import_preset",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    kind: text("kind").notNull(),
    crs: text("crs"),
    mapping: jsonb("mapping").notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("preset_org_kind_name_uq").on(t.orgId, t.kind, t.name)],
);

/** A key a farm's own scripts send as `Authorization: Bearer …`; carries its creator's organisation and role. */
export const apiKey = pgTable(
  "api_key",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => user.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** First characters of the key, shown so people can tell keys apart. */
    prefix: text("prefix").notNull(),
    /** SHA-256 of the whole key; the key itself is shown once and never stored. */
    hash: text("hash").notNull().unique(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    /** What the key may do within its creator's role: full, upload or read (lib/security/key-scope.ts). */
    scope: text("scope").$type<ApiKeyScope>().notNull().default("full"),
    /** From this instant on the key answers 401; null for a key that does not expire. */
    expiresAt: timestamp("expires_at", { withTimezone: true }),
  },
  (t) => [
    index("api_key_org_idx").on(t.orgId),
    check("api_key_scope_known", sql`${t.scope} in ('full', 'upload', 'read')`),
  ],
);

/** One comparison of a survey against as-planted records. */
export const audit = pgTable(
  "audit",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    fieldId: uuid("field_id")
      .notNull()
      .references(() => field.id, { onDelete: "restrict" }),
    plantedDatasetId: uuid("planted_dataset_id").references(() => dataset.id, { onDelete: "restrict" }),
    surveyDatasetId: uuid("survey_dataset_id").references(() => dataset.id, { onDelete: "restrict" }),
    title: text("title").notNull(),
    /** Lifecycle state; see lib/audit-states.ts once review lands. */
    state: text("state").notNull().default("draft"),
    profileId: uuid("profile_id").references(() => toleranceProfile.id, { onDelete: "set null" }),
    /** The profile's limits as they were when the audit was computed. */
    profileSnapshot: jsonb("profile_snapshot"),
    /** Pairing and statistics settings (match mode, maximum distance, row bearing, time zone). */
    settings: jsonb("settings"),
    /** The engine's JSON summary (same keys as the command line). */
    summary: jsonb("summary"),
    /** Pass/fail per criterion of the profile. */
    verdict: jsonb("verdict"),
    /** 0–1 while computing. */
    progress: real("progress").notNull().default(0),
    progressStage: text("progress_stage"),
    error: text("error"),
    computedAt: timestamp("computed_at", { withTimezone: true }),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
    /** 1 for a first audit; a returned audit re-run after corrections gets the next number. */
    revision: integer("revision").notNull().default(1),
    /** The returned audit this revision corrects (at most one revision per audit). */
    revisionOf: uuid("revision_of").references((): AnyPgColumn => audit.id, { onDelete: "restrict" }),
    /** Id of revision 1 of the chain; null on revision 1 itself. */
    seriesId: uuid("series_id"),
  },
  (t) => [
    index("audit_org_field_idx").on(t.orgId, t.fieldId),
    index("audit_org_state_idx").on(t.orgId, t.state),
    uniqueIndex("audit_revision_of_uq").on(t.revisionOf),
    index("audit_series_idx").on(t.seriesId),
  ],
);

/** Who did what, when. Append-only. */
export const activity = pgTable(
  "activity",
  {
    id: bigint("id", { mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    actorId: text("actor_id").references(() => user.id, { onDelete: "set null" }),
    action: text("action").notNull(),
    subjectType: text("subject_type").notNull(),
    subjectId: text("subject_id"),
    detail: jsonb("detail"),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("activity_org_at_idx").on(t.orgId, t.at)],
);

/** Per-plant residuals of an audit (survey minus planted, metres, work CRS). */
export const auditResidual = pgTable(
  "audit_residual",
  {
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audit.id, { onDelete: "restrict" }),
    seq: integer("seq").notNull(),
    plantId: text("plant_id"),
    surveyId: text("survey_id"),
    crop: text("crop"),
    bed: text("bed"),
    row: text("row"),
    arm: text("arm"),
    fix: text("fix"),
    /** Planting day in the field's time zone, YYYY-MM-DD. */
    day: text("day"),
    plantedE: doublePrecision("planted_e").notNull(),
    plantedN: doublePrecision("planted_n").notNull(),
    surveyE: doublePrecision("survey_e").notNull(),
    surveyN: doublePrecision("survey_n").notNull(),
    dE: doublePrecision("de").notNull(),
    dN: doublePrecision("dn").notNull(),
    along: doublePrecision("along"),
    cross: doublePrecision("cross"),
    radial: doublePrecision("radial").notNull(),
    within: boolean("within"),
    outlier: boolean("outlier").notNull(),
    /** "id" or "position". */
    pairedBy: text("paired_by").notNull(),
    beyondMaxDistance: boolean("beyond_max_distance").notNull(),
  },
  (t) => [primaryKey({ columns: [t.auditId, t.seq] }), index("residual_audit_radial_idx").on(t.auditId, t.radial)],
);

/** Points left unpaired by an audit. */
export const auditUnpaired = pgTable(
  "audit_unpaired",
  {
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audit.id, { onDelete: "restrict" }),
    seq: integer("seq").notNull(),
    /** "planted-not-found", "surveyed-not-planted" or "ambiguous". */
    kind: text("kind").notNull(),
    pointId: text("point_id"),
    line: integer("line").notNull(),
    e: doublePrecision("e").notNull(),
    n: doublePrecision("n").notNull(),
    crop: text("crop"),
    bed: text("bed"),
    row: text("row"),
  },
  (t) => [primaryKey({ columns: [t.auditId, t.seq] }), index("unpaired_audit_kind_idx").on(t.auditId, t.kind)],
);

/**
 * CSV reports written by the engine's own writers when the audit is computed (the same code the
 * command line uses), so a download is exactly what was computed and never regenerated differently.
 */
export const auditReport = pgTable(
  "audit_report",
  {
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audit.id, { onDelete: "restrict" }),
    /** "residuals", "unpaired" or "summary". */
    kind: text("kind").notNull(),
    /** A large report is stored in parts of at most REPORT_PART_BYTES, in order; read them back joined. */
    part: integer("part").notNull().default(0),
    /** In the database (embedded mode, or server mode without an object store)… */
    bytes: bytea("bytes"),
    /** …or one object of the object store (write-once key), with its size and SHA-256 to check it on reading. */
    objectKey: text("object_key"),
    sizeBytes: bigint("size_bytes", { mode: "number" }),
    sha256: text("sha256"),
  },
  (t) => [
    primaryKey({ columns: [t.auditId, t.kind, t.part] }),
    check(
      "audit_report_bytes_or_object",
      sql`(${t.bytes} is null) <> (${t.objectKey} is null) and (${t.objectKey} is null or (${t.sizeBytes} is not null and ${t.sha256} is not null))`,
    ),
  ],
);

// ---------------------------------------------------------------------------
// Review and sign-off (lifecycle: computed → submitted → signed_off | returned → new revision).
// Signed-off audits, their datasets, residuals and sign-off records are also guarded by database
// triggers (see migration 0003_review_signoff.sql), besides the 409 answers of the API.
// ---------------------------------------------------------------------------

/** One step of an audit's review: submitted, returned, signed off, revised, verified. Append-only. */
export const auditReviewEvent = pgTable(
  "audit_review_event",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audit.id, { onDelete: "restrict" }),
    revision: integer("revision").notNull(),
    /** "submitted" | "returned" | "signed_off" | "revised" | "verified". */
    kind: text("kind").notNull(),
    actorId: text("actor_id").references(() => user.id, { onDelete: "set null" }),
    /** The actor's name at the time, kept when the account goes. */
    actorName: text("actor_name").notNull(),
    actorRole: text("actor_role").notNull(),
    /** Submission note, return comment or deviation comment. */
    note: text("note"),
    /** Return reasons (codes, see lib/review/return-reasons.ts). */
    reasons: jsonb("reasons"),
    /** Outcome of a verification, or the new revision's id. */
    detail: jsonb("detail"),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("review_event_audit_at_idx").on(t.auditId, t.at), index("review_event_org_at_idx").on(t.orgId, t.at)],
);

/**
 * The sign-off of one audit revision: who signed, what they confirmed, and a SHA-256 over the
 * canonical JSON of the audit's inputs and results, stored beside that JSON.
 */
export const auditSignoff = pgTable(
  "audit_signoff",
  {
    auditId: uuid("audit_id")
      .primaryKey()
      .references(() => audit.id, { onDelete: "restrict" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    revision: integer("revision").notNull(),
    signerId: text("signer_id").references(() => user.id, { onDelete: "set null" }),
    /** Account name and role at the time of signing. */
    signerName: text("signer_name").notNull(),
    signerRole: text("signer_role").notNull(),
    /** The name the signer typed to sign. */
    typedName: text("typed_name").notNull(),
    /** What the signer confirmed, with the figures shown to them (lib/review/checklist.ts). */
    checklist: jsonb("checklist").notNull(),
    comment: text("comment"),
    /** True when some verdict criterion failed and the audit was accepted with deviation. */
    deviation: boolean("deviation").notNull(),
    /** "sha256". */
    algorithm: text("algorithm").notNull().default("sha256"),
    /** Hex SHA-256 of `canonical` (UTF-8). */
    sha256: text("sha256").notNull(),
    /** The canonical JSON that was hashed (lib/review/canonical.ts). */
    canonical: text("canonical").notNull(),
    signedAt: timestamp("signed_at", { withTimezone: true }).notNull(),
  },
  (t) => [index("signoff_org_idx").on(t.orgId, t.signedAt)],
);

/**
 * Messages captured by the fake SMTP server of demo mode (lib/server/mail/fake-smtp.ts), shown to
 * owners on /outbox. Nothing is stored here when a real SMTP relay is configured.
 */
export const mailCapture = pgTable(
  "mail_capture",
  {
    id: bigint("id", { mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    /** From the X-Plotproof-Org header; null for account mail such as password resets. */
    orgId: text("org_id").references(() => organization.id, { onDelete: "cascade" }),
    envelopeFrom: text("envelope_from"),
    envelopeTo: jsonb("envelope_to").notNull(),
    subject: text("subject").notNull(),
    /** From the X-Plotproof-Kind header: invitation, password-reset, audit-submitted, audit-signed-off, audit-returned, audit-alert. */
    kind: text("kind"),
    textBody: text("text_body").notNull(),
    raw: text("raw").notNull(),
    receivedAt: timestamp("received_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("mail_capture_received_idx").on(t.receivedAt)],
);

/**
 * Consecutive failed sign-ins per e-mail address (known or not, so the answer never tells which),
 * for the per-account backoff in lib/server/auth.ts. A successful sign-in deletes the row.
 */
export const signInFailure = pgTable("sign_in_failure", {
  email: text("email").primaryKey(),
  failures: integer("failures").notNull(),
  lastFailedAt: timestamp("last_failed_at", { withTimezone: true }).notNull(),
  lockedUntil: timestamp("locked_until", { withTimezone: true }),
});

// ---------------------------------------------------------------------------
// Survey plans, control marks and what a survey upload records about its fieldwork (lib/plan/).
// A plan is never edited; once a survey record names it, a trigger (hand-written part of the migration) refuses
// any change to it or its points. Survey records are never changed either.
// ---------------------------------------------------------------------------

/** Which plants a check survey measures, chosen before the fieldwork from one as-planted dataset. */
export const surveyPlan = pgTable(
  "survey_plan",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    fieldId: uuid("field_id")
      .notNull()
      .references(() => field.id, { onDelete: "restrict" }),
    plantedDatasetId: uuid("planted_dataset_id")
      .notNull()
      .references(() => dataset.id, { onDelete: "restrict" }),
    name: text("name").notNull(),
    profileId: uuid("profile_id").references(() => toleranceProfile.id, { onDelete: "set null" }),
    /** The tolerance profile as it was when the plan was made. */
    profileSnapshot: jsonb("profile_snapshot").notNull(),
    /** Failures allowed for, standards, strata, minimum per stratum, spares, spacing, bed-end margin, bearing. */
    parameters: jsonb("parameters").notNull(),
    /** Seed of the random selection (mulberry32), so the same plants can be chosen again. */
    seed: bigint("seed", { mode: "number" }).notNull(),
    /** The sample size and how it was decided (lib/plan/sample-size.ts). */
    sampleSize: jsonb("sample_size").notNull(),
    /** Per stratum: plants, checkpoints, spares, minimum. */
    strata: jsonb("strata").notNull(),
    /** Plants left out near bed ends, plants that could be chosen, bearing used. */
    selectionNotes: jsonb("selection_notes").notNull(),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdByName: text("created_by_name").notNull(),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("survey_plan_org_field_idx").on(t.orgId, t.fieldId)],
);

/** One plant a plan chose (a checkpoint or a spare), with its point name and position in the field's CRS. */
export const surveyPlanPoint = pgTable(
  "survey_plan_point",
  {
    planId: uuid("plan_id")
      .notNull()
      .references(() => surveyPlan.id, { onDelete: "cascade" }),
    seq: integer("seq").notNull(),
    name: text("name").notNull(),
    plantId: text("plant_id").notNull(),
    stratum: text("stratum").notNull(),
    spare: boolean("spare").notNull(),
    e: doublePrecision("e").notNull(),
    n: doublePrecision("n").notNull(),
    crop: text("crop"),
    bed: text("bed"),
    row: text("row"),
    arm: text("arm"),
  },
  (t) => [
    primaryKey({ columns: [t.planId, t.seq] }),
    uniqueIndex("survey_plan_point_name_uq").on(t.planId, t.name),
    index("survey_plan_point_plant_idx").on(t.planId, t.plantId),
  ],
);

/** A mark of known position in or near a field, measured before and after a survey to check the instrument. */
export const controlMark = pgTable(
  "control_mark",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    fieldId: uuid("field_id")
      .notNull()
      .references(() => field.id, { onDelete: "restrict" }),
    name: text("name").notNull(),
    /** Known easting/northing in the field's CRS, metres; height optional. */
    e: doublePrecision("e").notNull(),
    n: doublePrecision("n").notNull(),
    h: doublePrecision("h"),
    description: text("description"),
    /** Where the known position comes from (e.g. a survey report). */
    source: text("source"),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("control_mark_field_name_uq").on(t.fieldId, t.name), index("control_mark_org_idx").on(t.orgId)],
);

/** What a survey upload recorded about its fieldwork: plan, control-mark check, instrument, surveyor, coverage. */
export const surveyRecord = pgTable(
  "survey_record",
  {
    datasetId: uuid("dataset_id")
      .primaryKey()
      .references(() => dataset.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    planId: uuid("plan_id").references(() => surveyPlan.id, { onDelete: "restrict" }),
    controlMarkId: uuid("control_mark_id").references(() => controlMark.id, { onDelete: "restrict" }),
    /** The mark as it was (name, known E/N/H) and the measurements before/after. */
    markCheck: jsonb("mark_check"),
    /** The judgement of the instrument check (lib/plan/instrument-check.ts). */
    instrumentCheck: jsonb("instrument_check"),
    instrument: text("instrument"),
    serial: text("serial"),
    /** YYYY-MM-DD. */
    calibrationDate: text("calibration_date"),
    precisionMm: doublePrecision("precision_mm"),
    surveyor: text("surveyor"),
    method: text("method"),
    /** Planned points reported dead or not found. */
    missingReported: jsonb("missing_reported"),
    /** Coverage of the plan (lib/plan/coverage.ts). */
    coverage: jsonb("coverage"),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("survey_record_plan_idx").on(t.planId), index("survey_record_org_idx").on(t.orgId)],
);

// ---------------------------------------------------------------------------
// Machines and alerts (issue 13): the planting machines of an organisation, which machine recorded an as-planted
// upload, the organisation's alert thresholds and the breaches found when an audit is computed.
// ---------------------------------------------------------------------------

/** A planting machine: its tool arms and what it records positions with. */
export const machine = pgTable(
  "machine",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** Working width across the rows, metres. */
    workingWidthM: doublePrecision("working_width_m").notNull(),
    /** Number of tool arms (planting units). */
    toolArms: integer("tool_arms").notNull(),
    receiverNotes: text("receiver_notes"),
    cameraNotes: text("camera_notes"),
    createdBy: text("created_by").references(() => user.id, { onDelete: "set null" }),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("machine_org_name_uq").on(t.orgId, t.name),
    check("machine_width_positive", sql`${t.workingWidthM} > 0`),
    check("machine_arms_positive", sql`${t.toolArms} >= 1`),
  ],
);

/** Which machine recorded an as-planted upload (at most one; kept apart from the dataset row). */
export const datasetMachine = pgTable(
  "dataset_machine",
  {
    datasetId: uuid("dataset_id")
      .primaryKey()
      .references(() => dataset.id, { onDelete: "cascade" }),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    /** A machine named by an upload cannot be deleted. */
    machineId: uuid("machine_id")
      .notNull()
      .references(() => machine.id, { onDelete: "restrict" }),
  },
  (t) => [index("dataset_machine_machine_idx").on(t.orgId, t.machineId)],
);

/** The organisation's alert thresholds (one row per organisation; a null threshold is not checked). */
export const alertRule = pgTable("alert_rule", {
  orgId: text("org_id")
    .primaryKey()
    .references(() => organization.id, { onDelete: "cascade" }),
  /** Alert when an arm's mean cross-row error (fixed-fix checkpoints, significant) exceeds this, metres. */
  armCrossOffsetM: doublePrecision("arm_cross_offset_m"),
  /** Alert when the horizontal RMSE rose by more than this share (0.3 = 30 %) from the previous audit. */
  rmseRise: doublePrecision("rmse_rise"),
  /** Alert when the audit fails its tolerance profile. */
  failedVerdict: boolean("failed_verdict").notNull().default(false),
  updatedBy: text("updated_by").references(() => user.id, { onDelete: "set null" }),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

/** One threshold an audit breached when it was computed. */
export const alertBreach = pgTable(
  "alert_breach",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    orgId: text("org_id")
      .notNull()
      .references(() => organization.id, { onDelete: "cascade" }),
    auditId: uuid("audit_id")
      .notNull()
      .references(() => audit.id, { onDelete: "cascade" }),
    /** "arm-cross-offset", "rmse-rise" or "failed-verdict" (lib/audit/alerts.ts). */
    kind: text("kind").notNull(),
    /** The breach in one sentence, as listed and e-mailed. */
    message: text("message").notNull(),
    /** Figures of the breach (measured value, threshold, arm, previous audit). */
    detail: jsonb("detail"),
    createdAt: timestamp("created_at", { withTimezone: true }).notNull().defaultNow(),
    acknowledgedAt: timestamp("acknowledged_at", { withTimezone: true }),
    acknowledgedBy: text("acknowledged_by").references(() => user.id, { onDelete: "set null" }),
  },
  (t) => [
    index("alert_breach_org_created_idx").on(t.orgId, t.createdAt),
    index("alert_breach_audit_idx").on(t.auditId),
  ],
);

// --- Planted records nobody surveyed, stored compactly (issue 16) -----------------------------------------------
/**
 * The "planted-not-found" unpaired points of an audit in one value instead of a row each: which records of the
 * planted dataset were left unpaired (a bitset over its records, db/planted-not-found-blob.ts) and, when the work
 * CRS is not the file's own, their projected positions. Point ids, lines and strata come from the dataset's
 * points blob. They are the unpaired points with seq 0…count−1; audit_unpaired then holds only the survey-side
 * ones. An audit without a row here stores all its unpaired points as rows (audits computed before).
 */
export const auditPlantedNotFound = pgTable("audit_planted_not_found", {
  auditId: uuid("audit_id")
    .primaryKey()
    .references(() => audit.id, { onDelete: "restrict" }),
  /** Records of the planted dataset (bits in the set). */
  plants: integer("plants").notNull(),
  /** Planted records nobody surveyed (bits set). */
  count: integer("count").notNull(),
  bytes: bytea("bytes").notNull(),
});
