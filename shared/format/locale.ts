/**
 * The locale rule figures are written in. A studio picks it in its settings (en-GB unless changed). Screens set it
 * when they learn the studio's settings (`setFormatLocale`); server code that writes a document passes the studio's
 * locale explicitly, so that no request depends on what another request set.
 *
 * The current locale sits in a holder with a `value`. By default it is a plain object; the browser app hands in a
 * Vue ref (`keepFormatLocaleIn`), so that every render or computed value that wrote a figure with the current
 * locale reads the ref, and is written again when the admin saves another locale: figures already on screen change
 * at once, without a navigation. This module does not import Vue, so the server, the CLI and workers keep the plain
 * holder.
 */

/** The rule used until a studio has chosen another: British English (`€1,234.50`, `2 December 2026`). */
export const DEFAULT_LOCALE = 'en-GB';

/** Where the current locale is kept: anything with a `value`, such as a Vue ref. */
export interface LocaleHolder {
  value: string;
}

let current: LocaleHolder = { value: DEFAULT_LOCALE };

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
  if (isSupportedLocale(locale)) current.value = locale;
}

/** The locale the formatters use when none is passed. */
export function formatLocale(): string {
  return current.value;
}

/**
 * Keeps the current locale in `holder` from now on; the holder takes the current locale first. The browser app
 * passes a Vue ref, so that figures on screen follow a change of locale.
 * @param holder - the new holder (e.g. `ref(DEFAULT_LOCALE)`)
 */
export function keepFormatLocaleIn(holder: LocaleHolder): void {
  holder.value = current.value;
  current = holder;
}
