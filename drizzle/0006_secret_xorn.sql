CREATE TABLE "family_compute_runs" (
	"revision_id" text PRIMARY KEY NOT NULL,
	"generation" integer DEFAULT 0 NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE UNIQUE INDEX "job_dead_letters_job_id_idx" ON "job_dead_letters" USING btree ("job_id");