CREATE TABLE "audit_report" (
	"audit_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"bytes" "bytea" NOT NULL,
	CONSTRAINT "audit_report_audit_id_kind_pk" PRIMARY KEY("audit_id","kind")
);
--> statement-breakpoint
ALTER TABLE "audit_report" ADD CONSTRAINT "audit_report_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;