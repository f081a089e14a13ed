/** The price list of published variants, as rows, as CSV (RFC 4180) and as an .xlsx workbook. */
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { PriceListRow } from '../../shared/schemas/sales';
import { csvText } from '../csv/csvText';
import { productName } from './specSheet';
import type { Material } from '../../shared/schemas/production';
import { MM_PER_INCH } from '../../shared/format';

/** Column titles of the CSV and the sheet, in order, with units in the titles. */
export const PRICE_LIST_COLUMNS = [
  'SKU',
  'Product',
  'Family',
  'Material',
  'Colour',
  'Entry hole (mm)',
  'Entry hole (in)',
  'Mass (g)',
  'Currency',
  'Unit price',
] as const;

/**
 * One price-list row per variant. Shipping boxes are on each spec sheet, not here: they need the assembled body,
 * which is built from the template (about a second a variant), while the list must stay quick for hundreds of rows.
 * @param variants - published variants
 * @param materials - the studio's materials by id (for material and colour names)
 */
export function priceListRows(variants: CatalogueVariant[], materials: ReadonlyMap<string, Material>): PriceListRow[] {
  return variants.map((variant) => {
    const material = materials.get(variant.attributes.material);
    const colour = material?.colours.find((c) => c.id === variant.attributes.colour);
    return {
      sku: variant.sku,
      productName: productName(variant),
      familyName: variant.family.name,
      material: material?.name ?? variant.attributes.material,
      colour: colour?.name ?? variant.attributes.colour ?? '',
      entryHoleDiameterMm: variant.report.facts.entryHoleDiameterMm,
      massG: variant.report.massG,
      currency: variant.currency,
      unitPriceCents: variant.priceCents,
    };
  });
}

/** The cells of one row, in {@link PRICE_LIST_COLUMNS} order (numbers stay numbers). */
function cells(row: PriceListRow): Array<string | number> {
  return [
    row.sku,
    row.productName,
    row.familyName,
    row.material,
    row.colour,
    round(row.entryHoleDiameterMm, 1),
    round(row.entryHoleDiameterMm / MM_PER_INCH, 2),
    Math.round(row.massG),
    row.currency,
    round(row.unitPriceCents / 100, 2),
  ];
}

/**
 * The price list as CSV: a header row, then one row per variant; text cells quoted and safe against formula
 * injection ({@link csvText}: a family or product name is user input). Prices in currency units with two decimals.
 * @param rows - price-list rows
 */
export function priceListCsv(rows: PriceListRow[]): string {
  const priceColumn = PRICE_LIST_COLUMNS.length - 1;
  const records = rows.map((row) =>
    cells(row).map((cell, i) => (typeof cell === 'number' && i === priceColumn ? cell.toFixed(2) : cell)),
  );
  return csvText(PRICE_LIST_COLUMNS, records, { numericColumns: [priceColumn] });
}

/**
 * The price list as an .xlsx workbook (exceljs): a frozen bold header with a filter, and number formats.
 * @param rows - price-list rows
 * @param studioName - the studio, named as the workbook's author
 * @param issuedOn - the workbook's creation date (its document properties)
 */
export async function priceListXlsx(rows: PriceListRow[], studioName: string, issuedOn = new Date()): Promise<Buffer> {
  // Loaded on first use: the package takes a noticeable part of the server's start-up to load.
  const { default: ExcelJS } = await import('exceljs');
  const workbook = new ExcelJS.Workbook();
  workbook.creator = studioName;
  workbook.created = issuedOn;
  const sheet = workbook.addWorksheet('Price list', { views: [{ state: 'frozen', ySplit: 1 }] });
  sheet.columns = PRICE_LIST_COLUMNS.map((title) => ({
    header: title,
    key: title,
    width: Math.max(12, title.length + 2),
  }));
  sheet.getColumn(2).width = 44;
  sheet.getColumn(1).width = 24;
  for (const row of rows) sheet.addRow(cells(row));
  sheet.getRow(1).font = { bold: true };
  sheet.getColumn(PRICE_LIST_COLUMNS.length).numFmt = '#,##0.00';
  sheet.getColumn(7).numFmt = '0.00';
  sheet.autoFilter = { from: { row: 1, column: 1 }, to: { row: 1, column: PRICE_LIST_COLUMNS.length } };
  return Buffer.from(await workbook.xlsx.writeBuffer());
}

function round(value: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(value * f) / f;
}
