CREATE TABLE "sign_in_failure" (
	"email" text PRIMARY KEY NOT NULL,
	"failures" integer NOT NULL,
	"last_failed_at" timestamp with time zone NOT NULL,
	"locked_until" timestamp with time zone
);
