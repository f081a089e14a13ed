CREATE TABLE "service_endpoints" (
	"name" text PRIMARY KEY NOT NULL,
	"url" text NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "job_dead_letters" ADD COLUMN "resolution" text;--> statement-breakpoint
ALTER TABLE "job_dead_letters" ADD COLUMN "resolved_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "job_dead_letters" ADD COLUMN "resolved_by_id" text;--> statement-breakpoint
ALTER TABLE "job_dead_letters" ADD CONSTRAINT "job_dead_letters_resolved_by_id_people_id_fk" FOREIGN KEY ("resolved_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;