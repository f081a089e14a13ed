/**
 * Price list: the CSV parses with an independent parser (csv-parse) into the published variants with quoting
 * intact, and its prices sum to the catalogue's; the .xlsx reads back (exceljs) with the same rows and sum.
 */
import ExcelJS from 'exceljs';
import { parse } from 'csv-parse/sync';
import { describe, expect, it } from 'vitest';
import { PRICE_LIST_COLUMNS } from '../server/services/priceList';
import { binaryBody, useSalesTestApp } from './setup/salesTestApp';

const suite = useSalesTestApp();

describe('price list', () => {
  it('CSV: a header, one row per published variant, quoted fields intact, prices summing to the catalogue', async () => {
    const sales = await suite.t.agent('sales');
    const res = await sales.get('/api/price-list.csv');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="price-list-\d{4}-\d{2}-\d{2}\.csv"/);
    const records = parse(res.text, { columns: true, skip_empty_lines: true }) as Array<Record<string, string>>;
    const header = parse(res.text, { to_line: 1 })[0] as string[];
    expect(header).toEqual([...PRICE_LIST_COLUMNS]);

    const catalogue = (await sales.get('/api/catalogue')).body.variants as Array<{
      sku: string;
      priceCents: number;
      family: { name: string };
      report: { massG: number };
    }>;
    const catalogueMass = new Map(catalogue.map((v) => [v.sku, v.report.massG]));
    expect(records.map((r) => r.SKU).sort()).toEqual(catalogue.map((v) => v.sku).sort());
    // The family name holds a comma and double quotes: the CSV must quote and escape it.
    expect(res.text).toContain('"Hedgerow Gable, ""test"" edition"');
    for (const sku of suite.fixture.variants.map((v) => v.sku)) {
      expect(records.find((r) => r.SKU === sku)?.Family).toBe('Hedgerow Gable, "test" edition');
    }
    for (const record of records) {
      expect(record.Family).toBe(catalogue.find((v) => v.sku === record.SKU)?.family.name);
    }

    const csvSum = records.reduce((sum, r) => sum + Number(r['Unit price']), 0);
    const catalogueSum = catalogue.reduce((sum, v) => sum + v.priceCents / 100, 0);
    expect(csvSum).toBeCloseTo(catalogueSum, 6);
    for (const record of records) {
      // mm and inches agree (1 in = 25.4 mm)
      expect(Number(record['Entry hole (in)'])).toBeCloseTo(Number(record['Entry hole (mm)']) / 25.4, 2);
      expect(Number(record['Mass (g)'])).toBe(Math.round(catalogueMass.get(record.SKU) ?? NaN));
    }
    const hole28 = records.find((r) => r.SKU === suite.fixture.variants[0].sku);
    expect(Number(hole28?.['Entry hole (mm)'])).toBe(28);
  });

  it('XLSX: the same rows and sum, read back with exceljs', async () => {
    const sales = await suite.t.agent('sales');
    const res = await sales.get('/api/price-list.xlsx').buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(res.body as ExcelJS.Buffer);
    const sheet = workbook.getWorksheet('Price list');
    expect(sheet).toBeDefined();
    const header = (sheet!.getRow(1).values as unknown[]).slice(1);
    expect(header).toEqual([...PRICE_LIST_COLUMNS]);
    const priceColumn = PRICE_LIST_COLUMNS.indexOf('Unit price') + 1;
    let sum = 0;
    const skus: string[] = [];
    for (let r = 2; r <= sheet!.rowCount; r++) {
      skus.push(String(sheet!.getRow(r).getCell(1).value));
      sum += Number(sheet!.getRow(r).getCell(priceColumn).value);
    }
    const catalogue = (await sales.get('/api/catalogue')).body.variants as Array<{ sku: string; priceCents: number }>;
    expect(skus.sort()).toEqual(catalogue.map((v) => v.sku).sort());
    for (const sku of suite.fixture.variants.map((v) => v.sku)) expect(skus).toContain(sku);
    expect(sum).toBeCloseTo(
      catalogue.reduce((s, v) => s + v.priceCents / 100, 0),
      6,
    );
  });
});
