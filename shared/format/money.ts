/**
 * Money as people read it. One locale rule for the whole product (`./locale`): by default amounts are written the
 * British-English way (`€1,234.50`, `US$12.40`), whatever the currency; a studio's currency comes from its settings.
 */
import { formatLocale } from './locale';

/**
 * Digits after the decimal point of a currency (2 for EUR, 0 for JPY), as Intl knows them.
 * @param currency - ISO 4217 code
 */
export function currencyDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/**
 * An amount from integer minor units (cents), e.g. `€34.80`.
 * @param minor - amount in minor units of the currency
 * @param currency - ISO 4217 code
 * @param locale - BCP 47 tag; the current format locale when left out
 */
export function formatMoney(minor: number, currency: string, locale: string = formatLocale()): string {
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(minor / 10 ** currencyDigits(currency));
}

/**
 * An amount, or an em dash when there is none.
 * @param minor - amount in minor units, or null
 * @param currency - ISO 4217 code
 * @param locale - BCP 47 tag; the current format locale when left out
 */
export function formatMoneyOrDash(
  minor: number | null | undefined,
  currency: string,
  locale: string = formatLocale(),
): string {
  return minor === null || minor === undefined ? '—' : formatMoney(minor, currency, locale);
}
