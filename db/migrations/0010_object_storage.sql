ALTER TABLE "audit_report" ALTER COLUMN "bytes" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "dataset_file" ALTER COLUMN "bytes" DROP NOT NULL;--> statement-breakpoint
ALTER TABLE "audit_report" ADD COLUMN "object_key" text;--> statement-breakpoint
ALTER TABLE "audit_report" ADD COLUMN "size_bytes" bigint;--> statement-breakpoint
ALTER TABLE "audit_report" ADD COLUMN "sha256" text;--> statement-breakpoint
ALTER TABLE "dataset_file" ADD COLUMN "object_key" text;--> statement-breakpoint
ALTER TABLE "audit_report" ADD CONSTRAINT "audit_report_bytes_or_object" CHECK (("audit_report"."bytes" is null) <> ("audit_report"."object_key" is null) and ("audit_report"."object_key" is null or ("audit_report"."size_bytes" is not null and "audit_report"."sha256" is not null)));--> statement-breakpoint
ALTER TABLE "dataset_file" ADD CONSTRAINT "dataset_file_bytes_or_object" CHECK (("dataset_file"."bytes" is null) <> ("dataset_file"."object_key" is null));