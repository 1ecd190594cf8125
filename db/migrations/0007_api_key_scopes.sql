ALTER TABLE "api_key" ADD COLUMN "scope" text DEFAULT 'full' NOT NULL;--> statement-breakpoint
ALTER TABLE "api_key" ADD COLUMN "expires_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "api_key" ADD CONSTRAINT "api_key_scope_known" CHECK ("api_key"."scope" in ('full', 'upload', 'read'));