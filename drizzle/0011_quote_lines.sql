CREATE TABLE "quote_lines" (
	"id" text PRIMARY KEY NOT NULL,
	"quote_id" text NOT NULL,
	"position" integer NOT NULL,
	"sku" text NOT NULL,
	"product_name" text NOT NULL,
	"family_name" text NOT NULL,
	"quantity" integer NOT NULL,
	"unit_cost_cents" integer NOT NULL,
	"list_price_cents" integer NOT NULL,
	"discount_pct" double precision NOT NULL,
	"break_price_cents" integer NOT NULL,
	"unit_price_cents" integer NOT NULL,
	"price_set_by_hand" boolean DEFAULT false NOT NULL,
	"line_total_cents" integer NOT NULL,
	"margin_pct" double precision NOT NULL,
	"farm" jsonb NOT NULL,
	"breaks" jsonb NOT NULL,
	CONSTRAINT "quote_lines_quantity_positive" CHECK ("quote_lines"."quantity" > 0)
);
--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "status" text DEFAULT 'draft' NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "valid_until" date;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "terms" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "tax_rate_pct" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "shipping_cents" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "subtotal_cents" integer;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "tax_cents" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "cost_cents" integer;--> statement-breakpoint
ALTER TABLE "quotes" ADD COLUMN "copied_from_id" text;--> statement-breakpoint
ALTER TABLE "quote_lines" ADD CONSTRAINT "quote_lines_quote_id_quotes_id_fk" FOREIGN KEY ("quote_id") REFERENCES "public"."quotes"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "quote_lines_quote_position_idx" ON "quote_lines" USING btree ("quote_id","position");--> statement-breakpoint
ALTER TABLE "quotes" ADD CONSTRAINT "quotes_status_known" CHECK ("quotes"."status" in ('draft', 'sent', 'accepted', 'expired'));--> statement-breakpoint
-- Quotes made before lines existed: valid 30 days from the day they were made, goods total as subtotal, no tax or
-- shipping, and their one product as their one line.
UPDATE "quotes" SET "valid_until" = ("created_at" AT TIME ZONE 'UTC')::date + 30, "subtotal_cents" = "total_price_cents", "cost_cents" = "unit_cost_cents" * "quantity";--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "valid_until" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "subtotal_cents" SET NOT NULL;--> statement-breakpoint
ALTER TABLE "quotes" ALTER COLUMN "cost_cents" SET NOT NULL;--> statement-breakpoint
INSERT INTO "quote_lines" ("id", "quote_id", "position", "sku", "product_name", "family_name", "quantity", "unit_cost_cents", "list_price_cents", "discount_pct", "break_price_cents", "unit_price_cents", "price_set_by_hand", "line_total_cents", "margin_pct", "farm", "breaks")
SELECT gen_random_uuid()::text, "id", 0, "sku", "product_name", "family_name", "quantity", "unit_cost_cents", "list_price_cents", "discount_pct", "unit_price_cents", "unit_price_cents", false, "total_price_cents", "margin_pct", "farm", "breaks" FROM "quotes";
