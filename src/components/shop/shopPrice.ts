import type { ShopPriceDisplay } from '../../../shared/schemas/shop';
import { formatMinor } from '../../../shared/shop/formatMinor';
import { netOfGross } from '../../../shared/shop/vat';

/**
 * A shop price as the settings say to show it: with VAT (`€34.80 incl. VAT`) or before it (`€29.00 + VAT`).
 * @param grossMinor - the price with VAT, minor units
 * @param prices - currency, rate and how to show
 */
export function shopPriceText(grossMinor: number, prices: ShopPriceDisplay): string {
  if (prices.vatRatePct === 0) return formatMinor(grossMinor, prices.currency);
  return prices.showPricesWithVat
    ? `${formatMinor(grossMinor, prices.currency)} incl. ${prices.vatRatePct} % VAT`
    : `${formatMinor(netOfGross(grossMinor, prices.vatRatePct), prices.currency)} + ${prices.vatRatePct} % VAT`;
}

/** Millimetres with inches, e.g. `28 mm (1.10 in)`. @param mm - length @param digits - decimals of mm */
export function mmIn(mm: number, digits = 0): string {
  return `${mm.toFixed(digits)} mm (${(mm / 25.4).toFixed(2)} in)`;
}
