CREATE TABLE "job_dead_letters" (
	"id" serial PRIMARY KEY NOT NULL,
	"job_name" text NOT NULL,
	"job_id" text NOT NULL,
	"data" jsonb NOT NULL,
	"error" text NOT NULL,
	"attempts" integer NOT NULL,
	"failed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "rate_limit_hits" (
	"key" text PRIMARY KEY NOT NULL,
	"hits" integer NOT NULL,
	"reset_at" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE INDEX "job_dead_letters_failed_at_idx" ON "job_dead_letters" USING btree ("failed_at");--> statement-breakpoint
CREATE INDEX "rate_limit_hits_reset_at_idx" ON "rate_limit_hits" USING btree ("reset_at");