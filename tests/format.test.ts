/** The one format module: money, durations, masses, lengths and temperatures as people read them. */
import { afterEach, describe, expect, it } from 'vitest';
import { computed, ref } from 'vue';
import {
  addDays,
  DEFAULT_LOCALE,
  formatLocale,
  keepFormatLocaleIn,
  setFormatLocale,
  DOCUMENT_TIME_ZONE,
  formatDate,
  formatDateTime,
  formatTimeZone,
  inchDecimals,
  inches,
  isoDay,
  setFormatTimeZone,
  writtenDecimals,
  celsiusToFahrenheit,
  currencyDigits,
  formatCelsiusFahrenheit,
  formatHours,
  formatLength,
  formatMassG,
  formatMassGLb,
  formatMinutes,
  formatMmIn,
  formatMmInTriple,
  formatMoney,
  formatSize,
  G_PER_LB,
  MM_PER_INCH,
} from '../shared/format';

describe('unit constants', () => {
  it('uses the exact inch and pound of the international yard and pound agreement (1959)', () => {
    // source: international yard and pound agreement, 1959 (1 in = 25.4 mm; 1 lb = 0.45359237 kg exactly)
    expect(MM_PER_INCH).toBe(25.4);
    expect(G_PER_LB).toBe(453.59237);
  });

  it('converts water freezing and boiling points between Celsius and Fahrenheit', () => {
    // source: BIPM, The International System of Units (SI brochure, 9th ed., 2019): 0 °C = 32 °F, 100 °C = 212 °F
    expect(celsiusToFahrenheit(0)).toBe(32);
    expect(celsiusToFahrenheit(100)).toBe(212);
    expect(celsiusToFahrenheit(-40)).toBe(-40);
    expect(formatCelsiusFahrenheit(100)).toBe('100.0 °C (212 °F)');
  });
});

describe('formatMoney', () => {
  it('knows each currency’s minor unit', () => {
    // source: ISO 4217 (ISO, 2015), minor unit column: EUR 2, USD 2, JPY 0
    expect(currencyDigits('EUR')).toBe(2);
    expect(currencyDigits('USD')).toBe(2);
    expect(currencyDigits('JPY')).toBe(0);
  });

  it('writes amounts one way, with grouping and the currency sign', () => {
    expect(formatMoney(123450, 'EUR')).toBe('€1,234.50');
    expect(formatMoney(3480, 'GBP')).toBe('£34.80');
    expect(formatMoney(500, 'JPY')).toBe('JP¥500');
    expect(formatMoney(-250, 'EUR')).toBe('-€2.50');
  });
});

describe('durations and masses', () => {
  it('writes minutes as hours and zero-padded minutes', () => {
    expect(formatMinutes(45.4)).toBe('45 min');
    expect(formatMinutes(185)).toBe('3 h 05 min');
    expect(formatMinutes(119.6)).toBe('2 h 00 min');
    expect(formatHours(185)).toBe('3.1 h');
  });

  it('writes grams, kilograms and pounds', () => {
    expect(formatMassG(612.44)).toBe('612.4 g');
    // 453.59237 g is one pound by definition (international yard and pound agreement, 1959)
    expect(formatMassGLb(453.59237)).toBe('454 g (1.00 lb)');
    expect(formatMassGLb(2000)).toBe('2.00 kg (4.41 lb)');
  });
});

describe('lengths', () => {
  it('writes millimetres and inches (1 in = 25.4 mm)', () => {
    expect(formatMmIn(32)).toBe('32 mm (1.26 in)');
    // one inch rule: two more decimals than the millimetres (28.5 mm = 1.12205 in, written to thousandths)
    expect(formatMmIn(28.5)).toBe('28.5 mm (1.122 in)');
    expect(formatMmInTriple([254, 127, 25.4])).toBe('254 × 127 × 25 mm (10.00 × 5.00 × 1.00 in)');
    expect(formatLength(25.4, 'in')).toBe('1.000 in');
    expect(formatLength(25.4, 'mm')).toBe('25.4 mm');
    expect(formatSize([254, 127], 'in')).toBe('10.00 × 5.00 in');
    expect(formatSize([254, 127], 'mm')).toBe('254 × 127 mm');
  });
});

describe('the one inch rule', () => {
  it('gives inches two more decimals than the millimetres they stand for', () => {
    // source: 1 in = 25.4 mm exactly (international yard and pound agreement, 1959); 32 mm = 1.25984 in
    expect(inchDecimals(0)).toBe(2);
    expect(inchDecimals(1)).toBe(3);
    expect(inches(32)).toBe('1.26');
    expect(inches(32, 1)).toBe('1.260');
    expect(formatLength(32, 'in', 0)).toBe('1.26 in');
    expect(formatLength(32, 'in')).toBe('1.260 in');
    expect(writtenDecimals('180')).toBe(0);
    expect(writtenDecimals('0.60')).toBe(2);
    expect(writtenDecimals(12.5)).toBe(1);
  });
});

describe('dates and times', () => {
  // An instant late in the UTC day, so a zone east of UTC is already on the next day.
  const lateEvening = '2026-12-02T23:30:00Z';
  afterEach(() => setFormatTimeZone(DOCUMENT_TIME_ZONE));

  it("writes a day by the locale's medium date pattern", () => {
    // source: Unicode CLDR locale data (Unicode Consortium): medium date pattern en-GB "d MMM y",
    // en-US "MMM d, y", de "dd.MM.y"
    expect(formatDate('2026-12-02', 'en-GB')).toBe('2 Dec 2026');
    expect(formatDate('2026-12-02', 'en-US')).toBe('Dec 2, 2026');
    expect(formatDate('2026-12-02', 'de-DE')).toBe('02.12.2026');
    expect(formatDate('2098-12-31')).toBe('31 Dec 2098'); // default locale en-GB
  });

  it("writes an instant to the minute by the locale's medium date and short time patterns", () => {
    // source: Unicode CLDR locale data (Unicode Consortium): en-GB "d MMM y" + "HH:mm" joined by "{1}, {0}";
    // de "dd.MM.y" + "HH:mm" joined by "{1}, {0}"
    expect(formatDateTime(lateEvening, 'en-GB')).toBe('2 Dec 2026, 23:30');
    expect(formatDateTime(new Date(lateEvening), 'de-DE')).toBe('02.12.2026, 23:30');
  });

  it("writes instants in UTC unless a screen sets its viewer's zone", () => {
    expect(formatTimeZone()).toBe('UTC');
    // source: IANA time zone database: Europe/Berlin is UTC+1 in December (no summer time), Asia/Tokyo UTC+9
    setFormatTimeZone('Europe/Berlin');
    expect(formatDateTime(lateEvening, 'en-GB')).toBe('3 Dec 2026, 00:30');
    expect(formatDate(lateEvening, 'en-GB')).toBe('3 Dec 2026');
    setFormatTimeZone('Not/AZone'); // an unknown zone changes nothing
    expect(formatTimeZone()).toBe('Europe/Berlin');
    // A calendar day is a day, not an instant: it never shifts with the zone.
    setFormatTimeZone('Pacific/Pago_Pago'); // UTC−11
    expect(formatDate('2026-12-02', 'en-GB')).toBe('2 Dec 2026');
  });

  it('does not depend on the time zone of the machine it runs on', () => {
    const before = process.env.TZ;
    try {
      for (const tz of ['Asia/Tokyo', 'America/Los_Angeles', 'UTC']) {
        process.env.TZ = tz;
        // source: IANA time zone database: Asia/Tokyo UTC+9, America/Los_Angeles UTC−8 in December
        const localHour = { 'Asia/Tokyo': 8, 'America/Los_Angeles': 15, UTC: 23 }[tz];
        expect(new Date(lateEvening).getHours()).toBe(localHour); // the machine's zone really changed
        expect(formatDateTime(lateEvening, 'en-GB')).toBe('2 Dec 2026, 23:30');
        expect(formatDate(lateEvening, 'en-GB')).toBe('2 Dec 2026');
        expect(isoDay(lateEvening)).toBe('2026-12-02');
        expect(addDays(lateEvening, 28)).toBe('2026-12-30');
      }
    } finally {
      if (before === undefined) delete process.env.TZ;
      else process.env.TZ = before;
    }
  });

  it('counts calendar days across month and year ends, and says so when a date cannot be read', () => {
    // Common practice (Gregorian calendar): December has 31 days; 2028 is a leap year (29 February).
    expect(addDays('2026-12-30', 3)).toBe('2027-01-02');
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(formatDate('not a date')).toBe('—');
    expect(formatDateTime('')).toBe('—');
  });
});

describe('the format locale in a Vue ref', () => {
  afterEach(() => {
    setFormatLocale(DEFAULT_LOCALE);
    keepFormatLocaleIn({ value: DEFAULT_LOCALE });
  });

  it('writes a computed amount and date again when the locale changes, as the app does after an admin saves one', () => {
    // source: Unicode CLDR locale data (Unicode Consortium): de currency pattern "#,##0.00 ¤" with "." grouping,
    // "," decimals and a no-break space before the sign; de medium date "dd.MM.y"
    const held = ref(DEFAULT_LOCALE);
    keepFormatLocaleIn(held);
    const shown = computed(() => `${formatMoney(123450, 'EUR')} · ${formatDate('2026-12-02')}`);
    expect(shown.value).toBe('€1,234.50 · 2 Dec 2026');
    setFormatLocale('de-DE');
    expect(held.value).toBe('de-DE');
    expect(formatLocale()).toBe('de-DE');
    expect(shown.value).toBe('1.234,50\u00a0€ · 02.12.2026');
    setFormatLocale('not a locale'); // an unknown tag changes nothing
    expect(shown.value).toBe('1.234,50\u00a0€ · 02.12.2026');
  });

  it('hands the current locale to a new holder', () => {
    setFormatLocale('fr-FR');
    const held = ref(DEFAULT_LOCALE);
    keepFormatLocaleIn(held);
    expect(held.value).toBe('fr-FR');
  });
});
