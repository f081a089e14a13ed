CREATE TABLE "farm_dispatches" (
	"id" serial PRIMARY KEY NOT NULL,
	"order_id" text,
	"run_id" text,
	"attempt" integer DEFAULT 1 NOT NULL,
	"idempotency_key" text NOT NULL,
	"status" text DEFAULT 'queued' NOT NULL,
	"failures" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"next_attempt_at" timestamp with time zone DEFAULT now() NOT NULL,
	"farm_work_order_id" text,
	"farm_stage" text,
	"hold_code" text,
	"hold_message" text,
	"carrier" text,
	"tracking_code" text,
	"tracking_url" text,
	"reprints" integer DEFAULT 0 NOT NULL,
	"reprints_by_sku" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"farm_checked_at" timestamp with time zone,
	"farm_changed_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "farm_dispatches_status_known" CHECK ("farm_dispatches"."status" in ('queued','waiting','at_farm','held','done','withdrawn')),
	CONSTRAINT "farm_dispatches_one_subject" CHECK (("farm_dispatches"."order_id" is null) <> ("farm_dispatches"."run_id" is null))
);
--> statement-breakpoint
CREATE TABLE "farm_notices" (
	"notice_id" text PRIMARY KEY NOT NULL,
	"work_order_id" text NOT NULL,
	"kind" text NOT NULL,
	"outcome" text NOT NULL,
	"payload" jsonb NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "farm_print_files" (
	"mesh_sha256" text PRIMARY KEY NOT NULL,
	"format" text NOT NULL,
	"bytes" integer NOT NULL,
	"part_sizes_mm" jsonb NOT NULL,
	"uploaded_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "farm_runs" (
	"id" text PRIMARY KEY NOT NULL,
	"name" text NOT NULL,
	"items" jsonb NOT NULL,
	"plan" jsonb NOT NULL,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "farm_runs_name_unique" UNIQUE("name")
);
--> statement-breakpoint
ALTER TABLE "farm_dispatches" ADD CONSTRAINT "farm_dispatches_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "farm_dispatches" ADD CONSTRAINT "farm_dispatches_run_id_farm_runs_id_fk" FOREIGN KEY ("run_id") REFERENCES "public"."farm_runs"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "farm_dispatches_key_idx" ON "farm_dispatches" USING btree ("idempotency_key");--> statement-breakpoint
CREATE UNIQUE INDEX "farm_dispatches_work_order_idx" ON "farm_dispatches" USING btree ("farm_work_order_id");--> statement-breakpoint
CREATE INDEX "farm_dispatches_order_idx" ON "farm_dispatches" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "farm_dispatches_status_idx" ON "farm_dispatches" USING btree ("status");