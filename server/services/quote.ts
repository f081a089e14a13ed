/** Wholesale quotes: prices, totals and lead time from published variants, the sales settings and the farm. */
import { farmPlateGroups, plateRule, type PlateRule } from '../../shared/analysis/plateRule';
import { estimateFarmCapacity } from '../../shared/production/estimateFarmCapacity';
import { quoteTotals } from '../../shared/quotes/quoteTotals';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { PrinterProfile } from '../../shared/schemas/production';
import {
  QUOTE_DEFAULT_VALID_DAYS,
  type QuoteFarm,
  type QuoteInput,
  type QuoteLine,
  type QuoteLineFarm,
} from '../../shared/schemas/quote';
import type { FarmSettings, SalesSettings } from '../../shared/schemas/sales';
import { badRequest } from '../http/HttpError';
import { productName } from './specSheet';
import { addDays } from '../../shared/format';

/** A computed quote before it is saved (the header fields and the priced lines). */
export interface QuoteFigures {
  customerName: string;
  deliveryDate: string;
  validUntil: string;
  terms: string;
  currency: string;
  lines: QuoteLine[];
  subtotalCents: number;
  shippingCents: number;
  taxRatePct: number;
  taxCents: number;
  totalCents: number;
  costCents: number;
  marginPct: number;
  farm: QuoteFarm;
  earliestDeliveryDate: string;
  feasible: boolean;
}

/** The studio's printers by id (the database's printer profiles; only their build volumes are read). */
export type QuotePrinters = ReadonlyMap<string, Pick<PrinterProfile, 'buildVolumeMm'>>;

/** Largest total one quote may come to, in cents (what the database's amount columns hold). */
const MAX_TOTAL_CENTS = 2_000_000_000;

/**
 * Prices the lines of a quote and checks the delivery date against the farm's lead time.
 * Each line: unit price = the agreed price, else list price less the largest quantity break at or below its
 * quantity; margin = (price − cost) / price. Totals: see shared/quotes/quoteTotals.ts. Lead time: the lines print
 * one after another on the farm (see {@link quoteFarmPlan}), counted in calendar days from `today`.
 * @param variants - the published variants by SKU (every line's SKU must be there)
 * @param input - the checked quote body
 * @param settings - farm settings and quantity breaks
 * @param today - the quote date (UTC day is used)
 * @param printers - the studio's printers (see {@link variantPlateRule})
 */
export function computeQuote(
  variants: ReadonlyMap<string, CatalogueVariant>,
  input: QuoteInput,
  settings: SalesSettings,
  today: Date,
  printers: QuotePrinters,
): QuoteFigures {
  const lines = input.lines.map((line, index) => {
    const variant = variants.get(line.sku);
    if (!variant)
      throw badRequest(`There is no published product with the SKU ${line.sku}.`, [
        { in: 'body', path: `lines.${index}.sku`, message: 'This SKU is not in the catalogue.' },
      ]);
    return priceLine(variant, line.quantity, line.unitPriceCents ?? null, settings, printers);
  });
  const currency = lines.length > 0 ? variants.get(lines[0].sku)!.currency : 'EUR';
  const otherCurrency = input.lines.findIndex((line) => variants.get(line.sku)!.currency !== currency);
  if (otherCurrency >= 0)
    throw badRequest('Every line of one quote must be priced in the same currency.', [
      { in: 'body', path: `lines.${otherCurrency}.sku`, message: 'This product is priced in another currency.' },
    ]);
  const totals = quoteTotals({ lines, shippingCents: input.shippingCents, taxRatePct: input.taxRatePct });
  if (totals.totalCents > MAX_TOTAL_CENTS)
    throw badRequest('This quote comes to more than 20,000,000.00 in all: split it into several quotes.', [
      { in: 'body', path: 'lines', message: 'The quote is too large for one document.' },
    ]);
  const costCents = lines.reduce((sum, line) => sum + line.quantity * line.unitCostCents, 0);
  const farm = quoteFarmPlan(
    lines.map((line) => line.farm),
    settings.farm,
  );
  const earliestDeliveryDate = addDays(today, farm.leadTimeDays);
  return {
    customerName: input.customerName,
    deliveryDate: input.deliveryDate,
    validUntil: input.validUntil ?? addDays(today, QUOTE_DEFAULT_VALID_DAYS),
    terms: input.terms,
    currency,
    lines: lines.map((line, i) => ({ ...line, lineTotalCents: totals.lineTotalsCents[i] })),
    subtotalCents: totals.subtotalCents,
    shippingCents: input.shippingCents,
    taxRatePct: input.taxRatePct,
    taxCents: totals.taxCents,
    totalCents: totals.totalCents,
    costCents,
    marginPct: totals.subtotalCents > 0 ? ((totals.subtotalCents - costCents) / totals.subtotalCents) * 100 : 0,
    farm,
    earliestDeliveryDate,
    feasible: earliestDeliveryDate <= input.deliveryDate,
  };
}

/**
 * One priced line: the break price as default unit price, the agreed price when given, and its farm figures.
 * @param variant - the published variant
 * @param quantity - units
 * @param agreedPriceCents - unit price entered by hand, or null for the break price
 * @param settings - farm settings and quantity breaks
 * @param printers - the studio's printers (see {@link variantPlateRule})
 */
export function priceLine(
  variant: CatalogueVariant,
  quantity: number,
  agreedPriceCents: number | null,
  settings: SalesSettings,
  printers: QuotePrinters,
): QuoteLine {
  const listPriceCents = variant.priceCents;
  const applicable = settings.quantityBreaks.filter((b) => b.minQuantity <= quantity);
  const discountPct = applicable.length > 0 ? applicable[applicable.length - 1].discountPct : 0;
  const breakPriceCents = Math.round(listPriceCents * (1 - discountPct / 100));
  const unitPriceCents = agreedPriceCents ?? breakPriceCents;
  const unitCostCents = variant.cost.costCents;
  return {
    sku: variant.sku,
    productName: productName(variant),
    familyName: variant.family.name,
    quantity,
    unitCostCents,
    listPriceCents,
    discountPct,
    breakPriceCents,
    unitPriceCents,
    priceSetByHand: agreedPriceCents !== null,
    lineTotalCents: quantity * unitPriceCents,
    marginPct: unitPriceCents > 0 ? ((unitPriceCents - unitCostCents) / unitPriceCents) * 100 : 0,
    farm: lineFarm(variant, quantity, settings.farm, printers),
    breaks: settings.quantityBreaks.map((b) => ({
      minQuantity: b.minQuantity,
      discountPct: b.discountPct,
      unitPriceCents: Math.round(listPriceCents * (1 - b.discountPct / 100)),
    })),
  };
}

/** The plates and print days of one line on the farm (estimateFarmCapacity, without handling days). */
function lineFarm(
  variant: CatalogueVariant,
  quantity: number,
  farm: FarmSettings,
  printers: QuotePrinters,
): QuoteLineFarm {
  const copiesPerPlate = farm.copiesPerPlate ?? Math.max(1, variant.report.copiesPerPlate);
  const plate = variantPlateRule(variant, printers);
  const capacity = estimateFarmCapacity({
    unitsWanted: quantity,
    printers: farm.printers,
    hoursPerDay: farm.hoursPerDay,
    copiesPerPlate,
    printTimeMin: variant.report.printTimeMin,
    failureRatePct: farm.failureRatePct,
    plateChangeMin: farm.plateChangeMin,
    handlingDays: 0,
    // The plate rule: one group when the parts print together, one per part when each needs plates of its own.
    plateGroups: plate
      ? farmPlateGroups(
          plate,
          variant.report.partSizesMm ?? [variant.report.bboxSizeMm],
          variant.report.printTimeMin,
          farm.copiesPerPlate,
        )
      : undefined,
  });
  return {
    copiesPerPlate,
    platesPerUnit: plate?.platesPerUnit ?? 1,
    plateText: plate?.text ?? `${copiesPerPlate} per plate`,
    groups: capacity.groups,
    printTimeMin: variant.report.printTimeMin,
    plates: capacity.plates,
    platesPerPrinter: capacity.platesPerPrinter,
    plateTimeMin: capacity.plateTimeMin,
    expectedGoodUnits: capacity.expectedGoodUnits,
    printDays: capacity.printDays,
  };
}

/**
 * The variant's plate rule: as stored with its report, else worked out from its parts on its printer (variants
 * computed before the rule was kept); null when neither is known (one plate group of the stored copies per plate).
 * The printer is looked up among the studio's printers (the database's, so one an admin added counts too).
 * @param variant - the published variant
 * @param printers - the studio's printers by id
 */
export function variantPlateRule(
  variant: CatalogueVariant,
  printers: QuotePrinters,
): Pick<PlateRule, 'layout' | 'platesPerUnit' | 'groups' | 'text'> | null {
  const r = variant.report;
  if (r.plate && r.plate.groups.length > 0) return r.plate;
  const printer = printers.get(r.printerId);
  if (!r.partSizesMm?.length || !printer) return null;
  const { x, y, z } = printer.buildVolumeMm;
  const rule = plateRule(r.partSizesMm, [x, y, z]);
  return rule.groups.length > 0 ? rule : null;
}

/**
 * The farm plan of a whole quote: its lines print one after another on the same printers (each line's plates
 * spread over them), then the order is packed and dispatched together, so lead time = whole days of the summed
 * print days + handling days.
 * @param lines - each line's farm figures
 * @param farm - the farm settings
 */
export function quoteFarmPlan(lines: readonly QuoteLineFarm[], farm: FarmSettings): QuoteFarm {
  const printDays = lines.reduce((sum, line) => sum + line.printDays, 0);
  return {
    printers: farm.printers,
    hoursPerDay: farm.hoursPerDay,
    failureRatePct: farm.failureRatePct,
    plateChangeMin: farm.plateChangeMin,
    handlingDays: farm.handlingDays,
    plates: lines.reduce((sum, line) => sum + line.plates, 0),
    printDays,
    leadTimeDays: Math.ceil(printDays - 1e-9) + Math.ceil(farm.handlingDays),
  };
}
