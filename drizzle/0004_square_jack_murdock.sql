CREATE TABLE "order_lines" (
	"id" serial PRIMARY KEY NOT NULL,
	"order_id" text NOT NULL,
	"position" integer NOT NULL,
	"sku" text NOT NULL,
	"product_name" text NOT NULL,
	"mesh_sha256" text NOT NULL,
	"quantity" integer NOT NULL,
	"unit_price_minor" integer NOT NULL,
	"line_total_minor" integer NOT NULL,
	CONSTRAINT "order_lines_quantity_positive" CHECK ("order_lines"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "orders" (
	"id" text PRIMARY KEY NOT NULL,
	"number" integer GENERATED ALWAYS AS IDENTITY (sequence name "orders_number_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1001 CACHE 1),
	"customer_token" text NOT NULL,
	"state" text DEFAULT 'placed' NOT NULL,
	"email" text NOT NULL,
	"ship_to" jsonb NOT NULL,
	"currency" text NOT NULL,
	"subtotal_minor" integer NOT NULL,
	"shipping_minor" integer NOT NULL,
	"vat_minor" integer NOT NULL,
	"vat_rate_pct" double precision NOT NULL,
	"total_minor" integer NOT NULL,
	"payment_session_id" text,
	"payment_intent_id" text,
	"paid_minor" integer,
	"paid_at" timestamp with time zone,
	"payment_flag" text,
	"refund_id" text,
	"refunded_minor" integer,
	"tracking_url" text,
	"site_origin" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "orders_number_unique" UNIQUE("number"),
	CONSTRAINT "orders_customer_token_unique" UNIQUE("customer_token"),
	CONSTRAINT "orders_payment_session_id_unique" UNIQUE("payment_session_id"),
	CONSTRAINT "orders_state_known" CHECK ("orders"."state" in ('placed','paid','in_production','shipped','delivered','cancelled','refunded')),
	CONSTRAINT "orders_total_nonnegative" CHECK ("orders"."total_minor" >= 0)
);
--> statement-breakpoint
CREATE TABLE "payment_events" (
	"id" text PRIMARY KEY NOT NULL,
	"type" text NOT NULL,
	"order_id" text,
	"outcome" text NOT NULL,
	"payload" jsonb NOT NULL,
	"received_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "people" DROP CONSTRAINT "people_roles_known";--> statement-breakpoint
ALTER TABLE "order_lines" ADD CONSTRAINT "order_lines_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "payment_events" ADD CONSTRAINT "payment_events_order_id_orders_id_fk" FOREIGN KEY ("order_id") REFERENCES "public"."orders"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "order_lines_order_idx" ON "order_lines" USING btree ("order_id");--> statement-breakpoint
CREATE INDEX "order_lines_sku_idx" ON "order_lines" USING btree ("sku");--> statement-breakpoint
CREATE INDEX "orders_state_idx" ON "orders" USING btree ("state");--> statement-breakpoint
CREATE INDEX "orders_created_at_idx" ON "orders" USING btree ("created_at");--> statement-breakpoint
ALTER TABLE "people" ADD CONSTRAINT "people_roles_known" CHECK (cardinality("people"."roles") > 0 and "people"."roles" <@ array['designer','catalogue_manager','sales','operations','admin']::text[]);