CREATE TABLE "audit_planted_not_found" (
	"audit_id" uuid PRIMARY KEY NOT NULL,
	"plants" integer NOT NULL,
	"count" integer NOT NULL,
	"bytes" "bytea" NOT NULL
);
--> statement-breakpoint
ALTER TABLE "audit_planted_not_found" ADD CONSTRAINT "audit_planted_not_found_audit_id_audit_id_fk" FOREIGN KEY ("audit_id") REFERENCES "public"."audit"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
-- hand-written below
-- The compact planted-not-found value of a signed-off audit is refused like its rows (0004).
CREATE TRIGGER "audit_planted_not_found_signed_off_insert" AFTER INSERT ON "audit_planted_not_found" REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows_bulk"();
--> statement-breakpoint
CREATE TRIGGER "audit_planted_not_found_signed_off_update" AFTER UPDATE ON "audit_planted_not_found" REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows_bulk"();
--> statement-breakpoint
CREATE TRIGGER "audit_planted_not_found_signed_off_delete" AFTER DELETE ON "audit_planted_not_found" REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION "plotproof_refuse_signed_audit_rows_bulk"();
