/**
 * The locale rule figures are written in. A studio picks it in its settings (en-GB unless changed). Screens set it
 * once when they learn the studio's settings (`setFormatLocale`); server code that writes a document passes the
 * studio's locale explicitly, so that no request depends on what another request set.
 */

/** The rule used until a studio has chosen another: British English (`€1,234.50`, `2 December 2026`). */
export const DEFAULT_LOCALE = 'en-GB';

let current = DEFAULT_LOCALE;

/**
 * Whether the runtime can write figures in a locale (a BCP 47 tag such as `en-GB` or `de-DE`).
 * @param locale - BCP 47 language tag
 */
export function isSupportedLocale(locale: string): boolean {
  try {
    return Intl.NumberFormat.supportedLocalesOf([locale]).length === 1;
  } catch {
    return false;
  }
}

/**
 * Sets the locale the formatters use when none is passed (in the browser: the studio's setting).
 * An unknown tag leaves the current one in place.
 * @param locale - BCP 47 language tag
 */
export function setFormatLocale(locale: string): void {
  if (isSupportedLocale(locale)) current = locale;
}

/** The locale the formatters use when none is passed. */
export function formatLocale(): string {
  return current;
}
