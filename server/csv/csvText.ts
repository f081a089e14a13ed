/**
 * CSV for downloads people open in a spreadsheet, safe against formula ("CSV") injection: every text cell that
 * starts with a character a spreadsheet reads as the start of a formula (`=`, `+`, `-`, `@`, tab, carriage return)
 * gets a leading apostrophe, and every text cell is quoted, so a separator inside a name (a comma, or a semicolon
 * in locales that split on it) cannot start a new cell either. Numbers stay numbers. Use {@link csvText} for every
 * CSV the server sends (price list, orders, ...).
 */
import { stringify } from 'csv-stringify/sync';

/** Characters that make a spreadsheet treat a cell as a formula when they come first. */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * One text cell made safe to open in a spreadsheet: a leading `'` when it begins with `=`, `+`, `-`, `@`, tab or
 * carriage return; other text unchanged.
 * @param text - the cell's text as the user typed it
 */
export function neutraliseCsvCell(text: string): string {
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/** A cell of {@link csvText}: text is neutralised and quoted; numbers are written as they are; null is empty. */
export type CsvCell = string | number | null | undefined;

/** Options of {@link csvText}. */
export interface CsvTextOptions {
  /**
   * Column indexes whose string cells are numbers our own code formatted (e.g. a price as "12.50"); they are not
   * neutralised, so "-3.00" stays a negative number.
   */
  numericColumns?: readonly number[];
}

/**
 * Rows as CSV text (RFC 4180, CRLF line ends): the header row and every text cell quoted and neutralised.
 * @param header - column titles
 * @param rows - the records, cells in header order
 * @param options - see {@link CsvTextOptions}
 */
export function csvText(header: readonly string[], rows: readonly CsvCell[][], options: CsvTextOptions = {}): string {
  const numeric = new Set(options.numericColumns ?? []);
  const records = rows.map((row) =>
    row.map((cell, i) => {
      if (cell === null || cell === undefined) return '';
      if (typeof cell === 'number') return cell;
      return numeric.has(i) ? cell : neutraliseCsvCell(cell);
    }),
  );
  return stringify([header.map(neutraliseCsvCell), ...records], {
    record_delimiter: 'windows',
    quoted_string: true,
  });
}
