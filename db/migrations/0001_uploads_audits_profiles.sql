CREATE TABLE "api_key" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"user_id" text NOT NULL,
	"name" text NOT NULL,
	"prefix" text NOT NULL,
	"hash" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_used_at" timestamp with time zone,
	"revoked_at" timestamp with time zone,
	CONSTRAINT "api_key_hash_unique" UNIQUE("hash")
);
--> statement-breakpoint
CREATE TABLE "audit_residual" (
	"audit_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"plant_id" text,
	"survey_id" text,
	"crop" text,
	"bed" text,
	"row" text,
	"arm" text,
	"fix" text,
	"day" text,
	"planted_e" double precision NOT NULL,
	"planted_n" double precision NOT NULL,
	"survey_e" double precision NOT NULL,
	"survey_n" double precision NOT NULL,
	"de" double precision NOT NULL,
	"dn" double precision NOT NULL,
	"along" double precision,
	"cross" double precision,
	"radial" double precision NOT NULL,
	"within" boolean,
	"outlier" boolean NOT NULL,
	"paired_by" text NOT NULL,
	"beyond_max_distance" boolean NOT NULL,
	CONSTRAINT "audit_residual_audit_id_seq_pk" PRIMARY KEY("audit_id","seq")
);
--> statement-breakpoint
CREATE TABLE "audit_unpaired" (
	"audit_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"kind" text NOT NULL,
	"point_id" text,
	"line" integer NOT NULL,
	"e" double precision NOT NULL,
	"n" double precision NOT NULL,
	"crop" text,
	"bed" text,
	"row" text,
	CONSTRAINT "audit_unpaired_audit_id_seq_pk" PRIMARY KEY("audit_id","seq")
);
--> statement-breakpoint
CREATE TABLE "dataset_file" (
	"dataset_id" uuid PRIMARY KEY NOT NULL,
	"content_type" text NOT NULL,
	"bytes" "bytea" NOT NULL
);
--> statement-breakpoint
CREATE TABLE "import_preset" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"crs" text,
	"mapping" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tolerance_profile" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"name" text NOT NULL,
	"operation" text NOT NULL,
	"radial_m" double precision,
	"cross_m" double precision,
	"along_m" double precision,
	"required_share" double precision NOT NULL,
	"confidence" double precision DEFAULT 0.95 NOT NULL,
	"min_checkpoints" integer NOT NULL,
	"built_in" boolean DEFAULT false NOT NULL,
	"note" text,
	"updated_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "profile_id" uuid;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "profile_snapshot" jsonb;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "verdict" jsonb;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "progress" real DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "progress_stage" text;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "error" text;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "computed_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "format" text DEFAULT 'csv' NOT NULL;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "mapping" jsonb;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "accepted_warnings" jsonb;--> statement-breakpoint
ALTER TABLE "dataset" ADD COLUMN "points" "bytea";--> statement-breakpoint
ALTER TABLE "api_key" ADD CONSTRAINT "api_key_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "api_key" ADD CONSTRAINT "api_key_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_residual" ADD CONSTRAINT "audit_residual_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_unpaired" ADD CONSTRAINT "audit_unpaired_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_file" ADD CONSTRAINT "dataset_file_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_preset" ADD CONSTRAINT "import_preset_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_preset" ADD CONSTRAINT "import_preset_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_profile" ADD CONSTRAINT "tolerance_profile_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_profile" ADD CONSTRAINT "tolerance_profile_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "api_key_org_idx" ON "api_key" USING btree ("org_id");--> statement-breakpoint
CREATE INDEX "residual_audit_radial_idx" ON "audit_residual" USING btree ("audit_id","radial");--> statement-breakpoint
CREATE INDEX "unpaired_audit_kind_idx" ON "audit_unpaired" USING btree ("audit_id","kind");--> statement-breakpoint
CREATE UNIQUE INDEX "preset_org_kind_name_uq" ON "import_preset" USING btree ("org_id","kind","name");--> statement-breakpoint
CREATE UNIQUE INDEX "profile_org_name_uq" ON "tolerance_profile" USING btree ("org_id","name");--> statement-breakpoint
ALTER TABLE "audit" ADD CONSTRAINT "audit_profile_id_tolerance_profile_id_fk" FOREIGN KEY ("profile_id") REFERENCES "public"."tolerance_profile"("id") ON DELETE set null ON UPDATE no action;