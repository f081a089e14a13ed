/** A banded table for the sales documents. */
import { FONT } from './pdfFonts';
import { INK } from './pdfPageFrame';

/**
 * A simple table with a header row and banded rows; returns the y below it.
 * @param doc - the document
 * @param head - column titles
 * @param rows - cell texts
 * @param widths - column widths, points
 * @param x - left edge
 * @param y - top
 */
export function pdfTable(
  doc: PDFKit.PDFDocument,
  head: string[],
  rows: string[][],
  widths: number[],
  x: number,
  y: number,
): number {
  const total = widths.reduce((a, b) => a + b, 0);
  doc.rect(x, y, total, 15).fill(INK.accent);
  let cx = x;
  doc.font(FONT.bodySemibold).fontSize(8).fillColor('#ffffff');
  head.forEach((title, i) => {
    doc.text(title, cx + 4, y + 4, { width: widths[i] - 8, lineBreak: false });
    cx += widths[i];
  });
  let cursor = y + 15;
  rows.forEach((row, r) => {
    doc.font(FONT.body).fontSize(8);
    const h = Math.max(...row.map((cell, i) => doc.heightOfString(cell, { width: widths[i] - 8 }))) + 6;
    if (r % 2 === 1) doc.rect(x, cursor, total, h).fill(INK.band);
    cx = x;
    doc.fillColor(INK.text);
    row.forEach((cell, i) => {
      doc.text(cell, cx + 4, cursor + 3, { width: widths[i] - 8 });
      cx += widths[i];
    });
    cursor += h;
  });
  doc
    .moveTo(x, cursor)
    .lineTo(x + total, cursor)
    .lineWidth(0.5)
    .strokeColor(INK.rule)
    .stroke();
  return cursor + 6;
}
