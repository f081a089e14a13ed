/** ISO 3166-1 alpha-2 country codes, from the i18n-iso-countries data, without loading any language's names. */
import countries from 'i18n-iso-countries';

/**
 * True when `code` is an ISO 3166-1 alpha-2 code (upper-case).
 * @param code - e.g. `GB`
 */
export function isValidCountryCode(code: string): boolean {
  return /^[A-Z]{2}$/.test(code) && countries.isValid(code);
}
