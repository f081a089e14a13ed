import type { ShopPriceDisplay } from '../../../shared/schemas/shop';
import { netOfGross } from '../../../shared/shop/vat';
import { formatMmIn, formatMoney } from '../../../shared/format';

/**
 * A shop price as the settings say to show it: with VAT (`€34.80 incl. VAT`) or before it (`€29.00 + VAT`).
 * @param grossMinor - the price with VAT, minor units
 * @param prices - currency, rate and how to show
 */
export function shopPriceText(grossMinor: number, prices: ShopPriceDisplay): string {
  if (prices.vatRatePct === 0) return formatMoney(grossMinor, prices.currency);
  return prices.showPricesWithVat
    ? `${formatMoney(grossMinor, prices.currency)} incl. ${prices.vatRatePct} % VAT`
    : `${formatMoney(netOfGross(grossMinor, prices.vatRatePct), prices.currency)} + ${prices.vatRatePct} % VAT`;
}

/** Millimetres with inches, e.g. `28 mm (1.10 in)`. @param mm - length @param digits - decimals of mm */
export function mmIn(mm: number, digits = 0): string {
  return formatMmIn(mm, digits);
}
