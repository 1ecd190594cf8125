CREATE TABLE "control_mark" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"field_id" uuid NOT NULL,
	"name" text NOT NULL,
	"e" double precision NOT NULL,
	"n" double precision NOT NULL,
	"h" double precision,
	"description" text,
	"source" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "survey_plan" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"field_id" uuid NOT NULL,
	"planted_dataset_id" uuid NOT NULL,
	"name" text NOT NULL,
	"profile_id" uuid,
	"profile_snapshot" jsonb NOT NULL,
	"parameters" jsonb NOT NULL,
	"seed" bigint NOT NULL,
	"sample_size" jsonb NOT NULL,
	"strata" jsonb NOT NULL,
	"selection_notes" jsonb NOT NULL,
	"created_by" text,
	"created_by_name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "survey_plan_point" (
	"plan_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"name" text NOT NULL,
	"plant_id" text NOT NULL,
	"stratum" text NOT NULL,
	"spare" boolean NOT NULL,
	"e" double precision NOT NULL,
	"n" double precision NOT NULL,
	"crop" text,
	"bed" text,
	"row" text,
	"arm" text,
	CONSTRAINT "survey_plan_point_plan_id_seq_pk" PRIMARY KEY("plan_id","seq")
);
--> statement-breakpoint
CREATE TABLE "survey_record" (
	"dataset_id" uuid PRIMARY KEY NOT NULL,
	"org_id" text NOT NULL,
	"plan_id" uuid,
	"control_mark_id" uuid,
	"mark_check" jsonb,
	"instrument_check" jsonb,
	"instrument" text,
	"serial" text,
	"calibration_date" text,
	"precision_mm" double precision,
	"surveyor" text,
	"method" text,
	"missing_reported" jsonb,
	"coverage" jsonb,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "control_mark" ADD CONSTRAINT "control_mark_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "control_mark" ADD CONSTRAINT "control_mark_field_id_field_id_fk" FOREIGN KEY ("field_id") REFERENCES "public"."field"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "control_mark" ADD CONSTRAINT "control_mark_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan" ADD CONSTRAINT "survey_plan_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan" ADD CONSTRAINT "survey_plan_field_id_field_id_fk" FOREIGN KEY ("field_id") REFERENCES "public"."field"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan" ADD CONSTRAINT "survey_plan_planted_dataset_id_dataset_id_fk" FOREIGN KEY ("planted_dataset_id") REFERENCES "public"."dataset"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan" ADD CONSTRAINT "survey_plan_profile_id_tolerance_profile_id_fk" FOREIGN KEY ("profile_id") REFERENCES "public"."tolerance_profile"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan" ADD CONSTRAINT "survey_plan_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_plan_point" ADD CONSTRAINT "survey_plan_point_plan_id_survey_plan_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."survey_plan"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_record" ADD CONSTRAINT "survey_record_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_record" ADD CONSTRAINT "survey_record_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_record" ADD CONSTRAINT "survey_record_plan_id_survey_plan_id_fk" FOREIGN KEY ("plan_id") REFERENCES "public"."survey_plan"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_record" ADD CONSTRAINT "survey_record_control_mark_id_control_mark_id_fk" FOREIGN KEY ("control_mark_id") REFERENCES "public"."control_mark"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "survey_record" ADD CONSTRAINT "survey_record_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "control_mark_field_name_uq" ON "control_mark" USING btree ("field_id","name");--> statement-breakpoint
CREATE INDEX "control_mark_org_idx" ON "control_mark" USING btree ("org_id");--> statement-breakpoint
CREATE INDEX "survey_plan_org_field_idx" ON "survey_plan" USING btree ("org_id","field_id");--> statement-breakpoint
CREATE UNIQUE INDEX "survey_plan_point_name_uq" ON "survey_plan_point" USING btree ("plan_id","name");--> statement-breakpoint
CREATE INDEX "survey_plan_point_plant_idx" ON "survey_plan_point" USING btree ("plan_id","plant_id");--> statement-breakpoint
CREATE INDEX "survey_record_plan_idx" ON "survey_record" USING btree ("plan_id");--> statement-breakpoint
CREATE INDEX "survey_record_org_idx" ON "survey_record" USING btree ("org_id");--> statement-breakpoint
-- hand-written below
-- A plan a survey has used, its points, and every survey record are never changed: besides the API (which has no
-- route to change them), the database refuses. A deleted profile or account may still clear its link (SET NULL).
CREATE FUNCTION "plotproof_refuse_used_plan"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF (to_jsonb(NEW) - 'profile_id' - 'created_by') = (to_jsonb(OLD) - 'profile_id' - 'created_by') THEN
    RETURN NEW;
  END IF;
  IF EXISTS (SELECT 1 FROM "survey_record" WHERE "plan_id" = OLD."id") THEN
    RAISE EXCEPTION 'plotproof: survey plan % is used by a survey; it can no longer be changed', OLD."id";
  END IF;
  RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER "survey_plan_used_guard" BEFORE UPDATE ON "survey_plan" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_used_plan"();
--> statement-breakpoint
CREATE FUNCTION "plotproof_refuse_used_plan_points"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF EXISTS (SELECT 1 FROM "survey_record" WHERE "plan_id" = OLD."plan_id") THEN
    RAISE EXCEPTION 'plotproof: the points of survey plan % are used by a survey; they can no longer be changed', OLD."plan_id";
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER "survey_plan_point_used_guard" BEFORE UPDATE OR DELETE ON "survey_plan_point" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_used_plan_points"();
--> statement-breakpoint
CREATE FUNCTION "plotproof_refuse_survey_record_change"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  IF (to_jsonb(NEW) - 'created_by' - 'control_mark_id') = (to_jsonb(OLD) - 'created_by' - 'control_mark_id')
     AND (NEW."created_by" IS NULL OR NEW."created_by" = OLD."created_by")
     AND (NEW."control_mark_id" IS NULL OR NEW."control_mark_id" = OLD."control_mark_id") THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION 'plotproof: the record of survey % is kept as uploaded; it can no longer be changed', OLD."dataset_id";
END $$;
--> statement-breakpoint
CREATE TRIGGER "survey_record_guard" BEFORE UPDATE ON "survey_record" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_survey_record_change"();
