ALTER TABLE "quotes" DROP CONSTRAINT "quotes_quantity_positive";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "sku";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "product_name";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "family_name";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "quantity";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "unit_cost_cents";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "list_price_cents";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "discount_pct";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "unit_price_cents";--> statement-breakpoint
ALTER TABLE "quotes" DROP COLUMN "breaks";