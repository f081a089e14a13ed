/** Wholesale quotes: the figures from a published variant, the sales settings and the farm; saved and read back. */
import { desc, eq } from 'drizzle-orm';
import { farmPlateGroups, plateRule, type PlateRule } from '../../shared/analysis/plateRule';
import { DEFAULT_PRINTERS } from '../../shared/production/defaults';
import { estimateFarmCapacity } from '../../shared/production/estimateFarmCapacity';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { Quote, QuoteCreate, QuoteSummary } from '../../shared/schemas/quote';
import type { SalesSettings } from '../../shared/schemas/sales';
import type { Db } from '../db/client';
import { people, quotes, type QuoteRow } from '../db/schema';
import { productName } from './specSheet';

/** A computed quote before it is saved. */
export type QuoteFigures = Omit<Quote, 'id' | 'reference' | 'createdBy' | 'createdAt'>;

/**
 * Prices a quantity of a variant and checks the delivery date against the farm's lead time.
 * Unit price = list price less the largest quantity break at or below the quantity; margin = (price − cost) / price;
 * lead time = estimateFarmCapacity (plates spread over the printers, failures replaced) + handling days, counted in
 * calendar days from `today`.
 * @param variant - the published variant
 * @param request - SKU, quantity, delivery date, customer
 * @param settings - farm settings and quantity breaks
 * @param today - the quote date (UTC day is used)
 */
export function computeQuote(
  variant: CatalogueVariant,
  request: QuoteCreate,
  settings: SalesSettings,
  today: Date,
): QuoteFigures {
  const listPriceCents = variant.priceCents;
  const applicable = settings.quantityBreaks.filter((b) => b.minQuantity <= request.quantity);
  const discountPct = applicable.length > 0 ? applicable[applicable.length - 1].discountPct : 0;
  const unitPriceCents = Math.round(listPriceCents * (1 - discountPct / 100));
  const unitCostCents = variant.cost.costCents;
  const farmSettings = settings.farm;
  const copiesPerPlate = farmSettings.copiesPerPlate ?? Math.max(1, variant.report.copiesPerPlate);
  const plate = variantPlateRule(variant);
  const capacity = estimateFarmCapacity({
    unitsWanted: request.quantity,
    printers: farmSettings.printers,
    hoursPerDay: farmSettings.hoursPerDay,
    copiesPerPlate,
    printTimeMin: variant.report.printTimeMin,
    failureRatePct: farmSettings.failureRatePct,
    plateChangeMin: farmSettings.plateChangeMin,
    handlingDays: farmSettings.handlingDays,
    // The plate rule: one group when the parts print together, one per part when each needs plates of its own.
    plateGroups: plate
      ? farmPlateGroups(
          plate,
          variant.report.partSizesMm ?? [variant.report.bboxSizeMm],
          variant.report.printTimeMin,
          farmSettings.copiesPerPlate,
        )
      : undefined,
  });
  const earliestDeliveryDate = addDays(today, capacity.leadTimeDays);
  return {
    sku: variant.sku,
    productName: productName(variant),
    familyName: variant.family.name,
    customerName: request.customerName,
    quantity: request.quantity,
    deliveryDate: request.deliveryDate,
    currency: variant.currency,
    unitCostCents,
    listPriceCents,
    discountPct,
    unitPriceCents,
    totalPriceCents: unitPriceCents * request.quantity,
    marginPct: unitPriceCents > 0 ? ((unitPriceCents - unitCostCents) / unitPriceCents) * 100 : 0,
    farm: {
      printers: farmSettings.printers,
      hoursPerDay: farmSettings.hoursPerDay,
      copiesPerPlate,
      platesPerUnit: plate?.platesPerUnit ?? 1,
      plateText: plate?.text ?? `${copiesPerPlate} per plate`,
      failureRatePct: farmSettings.failureRatePct,
      plateChangeMin: farmSettings.plateChangeMin,
      handlingDays: farmSettings.handlingDays,
      printTimeMin: variant.report.printTimeMin,
      ...capacity,
    },
    earliestDeliveryDate,
    feasible: earliestDeliveryDate <= request.deliveryDate,
    breaks: settings.quantityBreaks.map((b) => ({
      minQuantity: b.minQuantity,
      discountPct: b.discountPct,
      unitPriceCents: Math.round(listPriceCents * (1 - b.discountPct / 100)),
    })),
  };
}

/**
 * The variant's plate rule: as stored with its report, else worked out from its parts on its printer (variants
 * computed before the rule was kept); null when neither is known (one plate group of the stored copies per plate).
 * @param variant - the published variant
 */
export function variantPlateRule(
  variant: CatalogueVariant,
): Pick<PlateRule, 'layout' | 'platesPerUnit' | 'groups' | 'text'> | null {
  const r = variant.report;
  if (r.plate && r.plate.groups.length > 0) return r.plate;
  const printer = DEFAULT_PRINTERS.find((p) => p.id === r.printerId);
  if (!r.partSizesMm?.length || !printer) return null;
  const { x, y, z } = printer.buildVolumeMm;
  const rule = plateRule(r.partSizesMm, [x, y, z]);
  return rule.groups.length > 0 ? rule : null;
}

/** YYYY-MM-DD of `days` calendar days after the UTC day of `from`. */
function addDays(from: Date, days: number): string {
  const d = new Date(Date.UTC(from.getUTCFullYear(), from.getUTCMonth(), from.getUTCDate() + days));
  return d.toISOString().slice(0, 10);
}

/** `Q-0007` from the running number. */
function reference(number: number): string {
  return `Q-${String(number).padStart(4, '0')}`;
}

function toQuote(row: QuoteRow, createdByName: string): Quote {
  return {
    id: row.id,
    reference: reference(row.number),
    sku: row.sku,
    productName: row.productName,
    familyName: row.familyName,
    customerName: row.customerName,
    quantity: row.quantity,
    deliveryDate: row.deliveryDate,
    currency: row.currency,
    unitCostCents: row.unitCostCents,
    listPriceCents: row.listPriceCents,
    discountPct: row.discountPct,
    unitPriceCents: row.unitPriceCents,
    totalPriceCents: row.totalPriceCents,
    marginPct: row.marginPct,
    farm: row.farm,
    earliestDeliveryDate: row.earliestDeliveryDate,
    feasible: row.feasible,
    breaks: row.breaks,
    createdBy: { id: row.createdById, name: createdByName },
    createdAt: row.createdAt.toISOString(),
  };
}

/**
 * Saves a computed quote.
 * @param db - database
 * @param figures - from {@link computeQuote}
 * @param person - who made it
 */
export async function insertQuote(db: Db, figures: QuoteFigures, person: { id: string; name: string }): Promise<Quote> {
  const [row] = await db
    .insert(quotes)
    .values({ ...figures, createdById: person.id })
    .returning();
  return toQuote(row, person.name);
}

/**
 * Every quote, newest first.
 * @param db - database
 */
export async function listQuotes(db: Db): Promise<QuoteSummary[]> {
  const rows = await db
    .select({ quote: quotes, name: people.name })
    .from(quotes)
    .innerJoin(people, eq(people.id, quotes.createdById))
    .orderBy(desc(quotes.createdAt), desc(quotes.number));
  return rows.map(({ quote, name }) => {
    const full = toQuote(quote, name);
    return {
      id: full.id,
      reference: full.reference,
      sku: full.sku,
      productName: full.productName,
      customerName: full.customerName,
      quantity: full.quantity,
      deliveryDate: full.deliveryDate,
      currency: full.currency,
      unitPriceCents: full.unitPriceCents,
      totalPriceCents: full.totalPriceCents,
      marginPct: full.marginPct,
      earliestDeliveryDate: full.earliestDeliveryDate,
      feasible: full.feasible,
      createdAt: full.createdAt,
      createdByName: name,
    };
  });
}

/**
 * One quote, or undefined.
 * @param db - database
 * @param id - quote id
 */
export async function findQuote(db: Db, id: string): Promise<Quote | undefined> {
  const [row] = await db
    .select({ quote: quotes, name: people.name })
    .from(quotes)
    .innerJoin(people, eq(people.id, quotes.createdById))
    .where(eq(quotes.id, id));
  return row ? toQuote(row.quote, row.name) : undefined;
}
