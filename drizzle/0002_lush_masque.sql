CREATE TABLE "quotes" (
	"id" text PRIMARY KEY NOT NULL,
	"number" serial NOT NULL,
	"sku" text NOT NULL,
	"product_name" text NOT NULL,
	"family_name" text NOT NULL,
	"customer_name" text NOT NULL,
	"quantity" integer NOT NULL,
	"delivery_date" date NOT NULL,
	"currency" text NOT NULL,
	"unit_cost_cents" integer NOT NULL,
	"list_price_cents" integer NOT NULL,
	"discount_pct" double precision NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"total_price_cents" integer NOT NULL,
	"margin_pct" double precision NOT NULL,
	"farm" jsonb NOT NULL,
	"breaks" jsonb NOT NULL,
	"earliest_delivery_date" date NOT NULL,
	"feasible" boolean NOT NULL,
	"created_by_id" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "quotes_number_unique" UNIQUE("number"),
	CONSTRAINT "quotes_quantity_positive" CHECK ("quotes"."quantity" > 0)
);
--> statement-breakpoint
CREATE TABLE "sales_settings" (
	"id" text PRIMARY KEY NOT NULL,
	"data" jsonb NOT NULL,
	"updated_by_id" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_created_by_id_people_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."people"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sales_settings" ADD CONSTRAINT "sales_settings_updated_by_id_people_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."people"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "quotes_created_at_idx" ON "quotes" USING btree ("created_at");