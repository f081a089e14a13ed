/** The one format module: money, durations, masses, lengths and temperatures as people read them. */
import { describe, expect, it } from 'vitest';
import {
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
    expect(formatMmIn(28.5)).toBe('28.5 mm (1.12 in)');
    expect(formatMmInTriple([254, 127, 25.4])).toBe('254 × 127 × 25 mm (10.00 × 5.00 × 1.00 in)');
    expect(formatLength(25.4, 'in')).toBe('1.000 in');
    expect(formatLength(25.4, 'mm')).toBe('25.4 mm');
    expect(formatSize([254, 127], 'in')).toBe('10.00 × 5.00 in');
    expect(formatSize([254, 127], 'mm')).toBe('254 × 127 mm');
  });
});
