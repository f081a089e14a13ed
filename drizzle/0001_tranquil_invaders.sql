CREATE TABLE "families" (
	"id" text PRIMARY KEY NOT NULL,
	"code" text NOT NULL,
	"owner_id" text NOT NULL,
	"current_revision" integer DEFAULT 1 NOT NULL,
	"published_revision" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "families_code_unique" UNIQUE("code")
);
--> statement-breakpoint
CREATE TABLE "family_acknowledgements" (
	"id" serial PRIMARY KEY NOT NULL,
	"revision_id" text NOT NULL,
	"code" text NOT NULL,
	"text" text NOT NULL,
	"person_id" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "family_photos" (
	"id" text PRIMARY KEY NOT NULL,
	"family_id" text NOT NULL,
	"caption" text DEFAULT '' NOT NULL,
	"width_px" integer NOT NULL,
	"height_px" integer NOT NULL,
	"original_type" text NOT NULL,
	"file_name" text NOT NULL,
	"thumb_file_name" text NOT NULL,
	"uploaded_by" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "family_revisions" (
	"id" text PRIMARY KEY NOT NULL,
	"family_id" text NOT NULL,
	"number" integer NOT NULL,
	"state" text DEFAULT 'draft' NOT NULL,
	"lock" integer DEFAULT 0 NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"template_id" text NOT NULL,
	"template_version" integer NOT NULL,
	"base_params" jsonb NOT NULL,
	"axes" jsonb NOT NULL,
	"support_budget_mm3" double precision NOT NULL,
	"printer_id" text NOT NULL,
	"material_id" text NOT NULL,
	"region" text,
	"compute_state" text DEFAULT 'idle' NOT NULL,
	"compute_done" integer DEFAULT 0 NOT NULL,
	"compute_total" integer DEFAULT 0 NOT NULL,
	"compute_started_at" timestamp with time zone,
	"compute_finished_at" timestamp with time zone,
	"compute_error" text,
	"comments" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"created_by" text,
	"submitted_at" timestamp with time zone,
	"approved_at" timestamp with time zone,
	"published_at" timestamp with time zone,
	"retired_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "family_variants" (
	"id" text PRIMARY KEY NOT NULL,
	"revision_id" text NOT NULL,
	"index" integer NOT NULL,
	"sku" text NOT NULL,
	"variant_key" text NOT NULL,
	"axis_values" jsonb NOT NULL,
	"params" jsonb NOT NULL,
	"attributes" jsonb NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"sha256" text,
	"report" jsonb,
	"cost" jsonb,
	"verdict" text,
	"reasons" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"bird_fit_warnings" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"error" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mail_messages" (
	"id" serial PRIMARY KEY NOT NULL,
	"from" text NOT NULL,
	"to" text[] NOT NULL,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mail_outbox" (
	"id" serial PRIMARY KEY NOT NULL,
	"to" text[] NOT NULL,
	"subject" text NOT NULL,
	"text" text NOT NULL,
	"status" text DEFAULT 'pending' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "families" ADD CONSTRAINT "families_owner_id_people_id_fk" FOREIGN KEY ("owner_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_acknowledgements" ADD CONSTRAINT "family_acknowledgements_revision_id_family_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."family_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_acknowledgements" ADD CONSTRAINT "family_acknowledgements_person_id_people_id_fk" FOREIGN KEY ("person_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_photos" ADD CONSTRAINT "family_photos_family_id_families_id_fk" FOREIGN KEY ("family_id") REFERENCES "public"."families"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_photos" ADD CONSTRAINT "family_photos_uploaded_by_people_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_revisions" ADD CONSTRAINT "family_revisions_family_id_families_id_fk" FOREIGN KEY ("family_id") REFERENCES "public"."families"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_revisions" ADD CONSTRAINT "family_revisions_created_by_people_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "family_variants" ADD CONSTRAINT "family_variants_revision_id_family_revisions_id_fk" FOREIGN KEY ("revision_id") REFERENCES "public"."family_revisions"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "family_acknowledgements_revision_code_idx" ON "family_acknowledgements" USING btree ("revision_id","code");--> statement-breakpoint
CREATE INDEX "family_photos_family_idx" ON "family_photos" USING btree ("family_id");--> statement-breakpoint
CREATE UNIQUE INDEX "family_revisions_family_number_idx" ON "family_revisions" USING btree ("family_id","number");--> statement-breakpoint
CREATE INDEX "family_revisions_state_idx" ON "family_revisions" USING btree ("state");--> statement-breakpoint
CREATE UNIQUE INDEX "family_variants_revision_sku_idx" ON "family_variants" USING btree ("revision_id","sku");--> statement-breakpoint
CREATE INDEX "family_variants_sku_idx" ON "family_variants" USING btree ("sku");--> statement-breakpoint
CREATE INDEX "mail_outbox_status_next_idx" ON "mail_outbox" USING btree ("status","next_attempt_at");