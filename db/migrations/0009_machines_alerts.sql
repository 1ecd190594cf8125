CREATE TABLE "alert_breach" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"audit_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"message" text NOT NULL,
	"detail" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"acknowledged_at" timestamp with time zone,
	"acknowledged_by" text
);
--> statement-breakpoint
CREATE TABLE "alert_rule" (
	"org_id" text PRIMARY KEY NOT NULL,
	"arm_cross_offset_m" double precision,
	"rmse_rise" double precision,
	"failed_verdict" boolean DEFAULT false NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "dataset_machine" (
	"dataset_id" uuid PRIMARY KEY NOT NULL,
	"org_id" text NOT NULL,
	"machine_id" uuid NOT NULL
);
--> statement-breakpoint
CREATE TABLE "machine" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"org_id" text NOT NULL,
	"name" text NOT NULL,
	"working_width_m" double precision NOT NULL,
	"tool_arms" integer NOT NULL,
	"receiver_notes" text,
	"camera_notes" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "machine_width_positive" CHECK ("machine"."working_width_m" > 0),
	CONSTRAINT "machine_arms_positive" CHECK ("machine"."tool_arms" >= 1)
);
--> statement-breakpoint
ALTER TABLE "alert_breach" ADD CONSTRAINT "alert_breach_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alert_breach" ADD CONSTRAINT "alert_breach_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alert_breach" ADD CONSTRAINT "alert_breach_acknowledged_by_user_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alert_rule" ADD CONSTRAINT "alert_rule_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "alert_rule" ADD CONSTRAINT "alert_rule_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_machine" ADD CONSTRAINT "dataset_machine_dataset_id_dataset_id_fk" FOREIGN KEY ("dataset_id") REFERENCES "public"."dataset"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_machine" ADD CONSTRAINT "dataset_machine_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "dataset_machine" ADD CONSTRAINT "dataset_machine_machine_id_machine_id_fk" FOREIGN KEY ("machine_id") REFERENCES "public"."machine"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine" ADD CONSTRAINT "machine_org_id_organization_id_fk" FOREIGN KEY ("org_id") REFERENCES "public"."organization"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "machine" ADD CONSTRAINT "machine_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "alert_breach_org_created_idx" ON "alert_breach" USING btree ("org_id","created_at");--> statement-breakpoint
CREATE INDEX "alert_breach_audit_idx" ON "alert_breach" USING btree ("audit_id");--> statement-breakpoint
CREATE INDEX "dataset_machine_machine_idx" ON "dataset_machine" USING btree ("org_id","machine_id");--> statement-breakpoint
CREATE UNIQUE INDEX "machine_org_name_uq" ON "machine" USING btree ("org_id","name");