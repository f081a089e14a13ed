/**
 * Digits after the decimal point of a currency (2 for EUR, 0 for JPY), as Intl knows them.
 * @param currency - ISO 4217 code
 */
export function currencyDigits(currency: string): number {
  return new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
}

/**
 * An amount in minor units as people read it, e.g. `€34.80`.
 * @param minor - amount in minor units (cents)
 * @param currency - ISO 4217 code
 */
export function formatMinor(minor: number, currency: string): string {
  const digits = currencyDigits(currency);
  return new Intl.NumberFormat('en-GB', { style: 'currency', currency }).format(minor / 10 ** digits);
}
