/**
 * The money of a quote in integer cents: line totals, subtotal, tax on goods and shipping, grand total.
 *
 * Rounding rule: line totals are exact (whole units × whole cents). Tax is worked out once, on the sum of the goods
 * and the shipping, and rounded half up to the whole cent (common practice for invoice-level tax; local tax rules
 * may ask otherwise). Shipping is taxed at the rate of the goods it delivers, as the charge for delivering goods is
 * part of their supply (HM Revenue & Customs, VAT Notice 700/24 "Postage and delivery charges").
 */

/** The amounts a quote adds up from. */
export interface QuoteTotalsInput {
  /** Each line's quantity and unit price. */
  lines: ReadonlyArray<{ quantity: number; unitPriceCents: number }>;
  shippingCents: number;
  /** Tax rate in percent, at most two decimals. */
  taxRatePct: number;
}

/** What {@link quoteTotals} gives. */
export interface QuoteTotals {
  lineTotalsCents: number[];
  subtotalCents: number;
  taxCents: number;
  totalCents: number;
}

/**
 * Adds up a quote.
 * @param input - lines, shipping and tax rate
 */
export function quoteTotals(input: QuoteTotalsInput): QuoteTotals {
  const lineTotalsCents = input.lines.map((line) => line.quantity * line.unitPriceCents);
  const subtotalCents = lineTotalsCents.reduce((sum, cents) => sum + cents, 0);
  const taxCents = taxHalfUp(subtotalCents + input.shippingCents, input.taxRatePct);
  return { lineTotalsCents, subtotalCents, taxCents, totalCents: subtotalCents + input.shippingCents + taxCents };
}

/**
 * Tax on a non-negative amount, rounded half up to the cent, in exact integer arithmetic (the rate is taken in
 * hundredths of a percent, so 7.25 % of 1,000 cents is 72.5 → 73 cents with no floating-point drift).
 * @param amountCents - the taxable amount
 * @param ratePct - the rate, percent
 */
export function taxHalfUp(amountCents: number, ratePct: number): number {
  const basisPoints = BigInt(Math.round(ratePct * 100));
  return Number((BigInt(amountCents) * basisPoints + 5000n) / 10000n);
}
