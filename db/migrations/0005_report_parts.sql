-- A large CSV report (150 MB for a million plants) is stored in parts, each its own statement, so
-- PGlite is never held for seconds by one value.
ALTER TABLE "audit_report" ADD COLUMN "part" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "audit_report" DROP CONSTRAINT "audit_report_audit_id_kind_pk";--> statement-breakpoint
ALTER TABLE "audit_report" ADD CONSTRAINT "audit_report_audit_id_kind_part_pk" PRIMARY KEY("audit_id","kind","part");
