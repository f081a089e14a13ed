import type { ShopSettings } from '../schemas/shop';

/** Countries of the European Union besides the home country (ISO 3166-1 alpha-2). */
const EU_COUNTRIES = [
  'AT',
  'BE',
  'BG',
  'HR',
  'CY',
  'CZ',
  'DK',
  'EE',
  'FI',
  'FR',
  'DE',
  'GR',
  'HU',
  'IE',
  'IT',
  'LV',
  'LT',
  'LU',
  'MT',
  'NL',
  'PL',
  'PT',
  'RO',
  'SK',
  'SI',
  'ES',
  'SE',
];

/**
 * Shop settings of the invented demo studio until an admin saves their own: euros, 20 % VAT shown in the price,
 * an hour to pay, and a shipping table under the metric 5,000 cm³/kg divisor. The rates are the scenario's own
 * figures (common practice, no source).
 */
export const DEFAULT_SHOP_SETTINGS: ShopSettings = {
  currency: 'EUR',
  vatRatePct: 20,
  showPricesWithVat: true,
  checkoutExpiryMin: 60,
  shipping: {
    divisorId: 'metric-5000',
    weightBandsKg: [2, 5, 10, 20, 30],
    zones: [
      { id: 'home', label: 'United Kingdom', countries: ['GB'], ratesMinor: [595, 795, 1195, 1795, 2495] },
      { id: 'europe', label: 'European Union', countries: EU_COUNTRIES, ratesMinor: [1295, 1695, 2495, 3695, 4995] },
      { id: 'world', label: 'Rest of the world', countries: [], ratesMinor: [2295, 3295, 4995, 7495, 9995] },
    ],
  },
};
