import countries from 'i18n-iso-countries';
import en from 'i18n-iso-countries/langs/en.json';

countries.registerLocale(en);

/** Every country as `{ code, name }` in English, sorted by name (the checkout's country list). */
export function countryOptions(): Array<{ code: string; name: string }> {
  return Object.entries(countries.getNames('en', { select: 'official' }))
    .map(([code, name]) => ({ code, name }))
    .sort((a, b) => a.name.localeCompare(b.name, 'en'));
}
