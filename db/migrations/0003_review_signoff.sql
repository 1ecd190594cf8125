CREATE TABLE "audit_review_event" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"audit_id" uuid NOT NULL,
	"revision" integer NOT NULL,
	"kind" text NOT NULL,
	"actor_id" text,
	"actor_name" text NOT NULL,
	"actor_role" text NOT NULL,
	"note" text,
	"reasons" jsonb,
	"detail" jsonb,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "audit_signoff" (
	"audit_id" uuid PRIMARY KEY NOT NULL,
	"org_id" text NOT NULL,
	"revision" integer NOT NULL,
	"signer_id" text,
	"signer_name" text NOT NULL,
	"signer_role" text NOT NULL,
	"typed_name" text NOT NULL,
	"checklist" jsonb NOT NULL,
	"comment" text,
	"deviation" boolean NOT NULL,
	"algorithm" text DEFAULT 'sha256' NOT NULL,
	"sha256" text NOT NULL,
	"canonical" text NOT NULL,
	"signed_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mail_capture" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "mail_capture_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"org_id" text,
	"envelope_from" text,
	"envelope_to" jsonb NOT NULL,
	"subject" text NOT NULL,
	"kind" text,
	"text_body" text NOT NULL,
	"raw" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "revision" integer DEFAULT 1 NOT NULL;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "revision_of" uuid;--> statement-breakpoint
ALTER TABLE "audit" ADD COLUMN "series_id" uuid;--> statement-breakpoint
ALTER TABLE "audit_review_event" ADD CONSTRAINT "audit_review_event_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_review_event" ADD CONSTRAINT "audit_review_event_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_review_event" ADD CONSTRAINT "audit_review_event_actor_id_user_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_signoff" ADD CONSTRAINT "audit_signoff_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_signoff" ADD CONSTRAINT "audit_signoff_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "audit_signoff" ADD CONSTRAINT "audit_signoff_signer_id_user_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mail_capture" ADD CONSTRAINT "mail_capture_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "review_event_audit_at_idx" ON "audit_review_event" USING btree ("audit_id","at");--> statement-breakpoint
CREATE INDEX "review_event_org_at_idx" ON "audit_review_event" USING btree ("org_id","at");--> statement-breakpoint
CREATE INDEX "signoff_org_idx" ON "audit_signoff" USING btree ("org_id","signed_at");--> statement-breakpoint
CREATE INDEX "mail_capture_received_idx" ON "mail_capture" USING btree ("received_at");--> statement-breakpoint
ALTER TABLE "audit" ADD CONSTRAINT "audit_revision_of_audit_id_fk" FOREIGN KEY ("revision_of") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "audit_revision_of_uq" ON "audit" USING btree ("revision_of");--> statement-breakpoint
CREATE INDEX "audit_series_idx" ON "audit" USING btree ("series_id");--> statement-breakpoint
-- Nothing signed is ever silently changed: besides the API's 409 answers, the database itself refuses
-- to change or delete a signed-off audit, its result rows, its input datasets and its sign-off record.
CREATE FUNCTION "plotproof_refuse_signed_audit"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  -- The one change allowed: a deleted profile or account clears its link (ON DELETE SET NULL). The audit keeps
  -- its own copy of the profile, and the signed hash never covered these links.
  IF TG_OP = 'UPDATE' AND OLD."state" = 'signed_off'
     AND (to_jsonb(NEW) - 'profile_id' - 'created_by') = (to_jsonb(OLD) - 'profile_id' - 'created_by')
     AND (NEW."profile_id" IS NULL OR NEW."profile_id" = OLD."profile_id")
     AND (NEW."created_by" IS NULL OR NEW."created_by" = OLD."created_by") THEN
    RETURN NEW;
  END IF;
  IF OLD."state" = 'signed_off' THEN
    RAISE EXCEPTION 'plotproof: audit % is signed off; it can no longer be changed or deleted', OLD."id";
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER "audit_signed_off_guard" BEFORE UPDATE OR DELETE ON "audit" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_audit"();
--> statement-breakpoint
CREATE FUNCTION "plotproof_refuse_signed_audit_rows"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE target uuid;
BEGIN
  target := CASE WHEN TG_OP = 'INSERT' THEN NEW."audit_id" ELSE OLD."audit_id" END;
  IF EXISTS (SELECT 1 FROM "audit" WHERE "id" = target AND "state" = 'signed_off')
     OR (TG_OP = 'UPDATE' AND EXISTS (SELECT 1 FROM "audit" WHERE "id" = NEW."audit_id" AND "state" = 'signed_off')) THEN
    RAISE EXCEPTION 'plotproof: rows of the signed-off audit % can no longer be changed or deleted', target;
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER "audit_residual_signed_off_guard" BEFORE INSERT OR UPDATE OR DELETE ON "audit_residual" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows"();
--> statement-breakpoint
CREATE TRIGGER "audit_unpaired_signed_off_guard" BEFORE INSERT OR UPDATE OR DELETE ON "audit_unpaired" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows"();
--> statement-breakpoint
CREATE TRIGGER "audit_report_signed_off_guard" BEFORE INSERT OR UPDATE OR DELETE ON "audit_report" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows"();
--> statement-breakpoint
CREATE FUNCTION "plotproof_refuse_signed_dataset"() RETURNS trigger LANGUAGE plpgsql AS $$
DECLARE target uuid;
BEGIN
  -- A deleted account clears the uploader link (ON DELETE SET NULL); nothing else may change.
  IF TG_OP = 'UPDATE' AND TG_TABLE_NAME = 'dataset' THEN
    IF (to_jsonb(NEW) -> 'uploaded_by') = 'null'::jsonb AND (to_jsonb(NEW) - 'uploaded_by') = (to_jsonb(OLD) - 'uploaded_by') THEN
      RETURN NEW;
    END IF;
  END IF;
  IF TG_TABLE_NAME = 'dataset_file' THEN
    target := OLD."dataset_id";
  ELSE
    target := OLD."id";
  END IF;
  IF EXISTS (SELECT 1 FROM "audit" WHERE "state" = 'signed_off' AND ("planted_dataset_id" = target OR "survey_dataset_id" = target)) THEN
    RAISE EXCEPTION 'plotproof: dataset % is an input of a signed-off audit; it can no longer be changed or deleted', target;
  END IF;
  IF TG_OP = 'DELETE' THEN RETURN OLD; END IF;
  RETURN NEW;
END $$;
--> statement-breakpoint
CREATE TRIGGER "dataset_signed_off_guard" BEFORE UPDATE OR DELETE ON "dataset" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_dataset"();
--> statement-breakpoint
CREATE TRIGGER "dataset_file_signed_off_guard" BEFORE UPDATE OR DELETE ON "dataset_file" FOR EACH ROW EXECUTE FUNCTION "plotproof_refuse_signed_dataset"();
--> statement-breakpoint
CREATE FUNCTION "plotproof_append_only"() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  -- TG_ARGV[0] names the account column a deleted account may clear (ON DELETE SET NULL); nothing else may change.
  IF TG_OP = 'UPDATE' AND (to_jsonb(NEW) -> TG_ARGV[0]) = 'null'::jsonb
     AND (to_jsonb(NEW) - TG_ARGV[0]) = (to_jsonb(OLD) - TG_ARGV[0]) THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION 'plotproof: % rows are never changed or deleted', TG_TABLE_NAME;
END $$;
--> statement-breakpoint
CREATE TRIGGER "audit_signoff_append_only" BEFORE UPDATE OR DELETE ON "audit_signoff" FOR EACH ROW EXECUTE FUNCTION "plotproof_append_only"('signer_id');
--> statement-breakpoint
CREATE TRIGGER "audit_review_event_append_only" BEFORE UPDATE OR DELETE ON "audit_review_event" FOR EACH ROW EXECUTE FUNCTION "plotproof_append_only"('actor_id');
