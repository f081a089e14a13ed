/** The frame every sales document shares: studio line, title block, footer with page numbers. */
import { FONT } from './pdfFonts';

/** Page geometry of the A4 sales documents, points. */
export const PAGE = { width: 595.28, height: 841.89, margin: 42 } as const;
/** Usable width between the margins. */
export const CONTENT_WIDTH = PAGE.width - 2 * PAGE.margin;

/** Colours of the documents (our own palette: ink, moss, muted). */
export const INK = { text: '#25231e', muted: '#6c675b', accent: '#2f5230', rule: '#ddd5c3', band: '#f5f0e4' } as const;

/**
 * Writes the studio line and the document kind at the top of the current page.
 * @param doc - the document
 * @param studioName - e.g. Fernhollow Studio
 * @param kind - e.g. `Product specification`
 */
export function pageHeader(doc: PDFKit.PDFDocument, studioName: string, kind: string): void {
  const { margin } = PAGE;
  doc.rect(0, 0, PAGE.width, 6).fill(INK.accent);
  doc.font(FONT.bodySemibold).fontSize(8).fillColor(INK.accent);
  doc.text(studioName.toUpperCase(), margin, 22, { characterSpacing: 1.2, lineBreak: false });
  doc.font(FONT.body).fontSize(8).fillColor(INK.muted);
  doc.text(kind, margin, 22, { width: CONTENT_WIDTH, align: 'right', lineBreak: false });
  doc
    .moveTo(margin, 36)
    .lineTo(PAGE.width - margin, 36)
    .lineWidth(0.5)
    .strokeColor(INK.rule)
    .stroke();
}

/**
 * Writes the footer on every buffered page: a note on the left, "page n of m" on the right.
 * @param doc - a document created with `bufferPages: true`
 * @param note - left footer text
 */
export function pageFooters(doc: PDFKit.PDFDocument, note: string): void {
  const range = doc.bufferedPageRange();
  for (let i = range.start; i < range.start + range.count; i++) {
    doc.switchToPage(i);
    const y = PAGE.height - PAGE.margin + 14;
    doc
      .moveTo(PAGE.margin, y - 6)
      .lineTo(PAGE.width - PAGE.margin, y - 6)
      .lineWidth(0.5)
      .strokeColor(INK.rule)
      .stroke();
    doc.font(FONT.body).fontSize(7).fillColor(INK.muted);
    // Writing below the bottom margin would add a page: lift the margin for the footer line.
    const bottom = doc.page.margins.bottom;
    doc.page.margins.bottom = 0;
    doc.text(note, PAGE.margin, y, { width: CONTENT_WIDTH - 80, lineBreak: false });
    doc.text(`Page ${i - range.start + 1} of ${range.count}`, PAGE.margin, y, {
      width: CONTENT_WIDTH,
      align: 'right',
      lineBreak: false,
    });
    doc.page.margins.bottom = bottom;
  }
}

/**
 * A section heading with a rule under it; returns the y below it.
 * @param doc - the document
 * @param title - heading text
 * @param x - left edge
 * @param y - top
 * @param width - rule length
 */
export function sectionHeading(doc: PDFKit.PDFDocument, title: string, x: number, y: number, width: number): number {
  doc.font(FONT.bodyBold).fontSize(9.5).fillColor(INK.accent);
  doc.text(title.toUpperCase(), x, y, { characterSpacing: 0.9, lineBreak: false });
  doc
    .moveTo(x, y + 13)
    .lineTo(x + width, y + 13)
    .lineWidth(0.5)
    .strokeColor(INK.rule)
    .stroke();
  return y + 19;
}

/**
 * Label–value rows in two columns; returns the y below the last row.
 * @param doc - the document
 * @param rows - label and value pairs
 * @param x - left edge
 * @param y - top
 * @param width - total width
 * @param labelWidth - width of the label column
 */
export function keyValueRows(
  doc: PDFKit.PDFDocument,
  rows: Array<[string, string]>,
  x: number,
  y: number,
  width: number,
  labelWidth = 110,
): number {
  let cursor = y;
  rows.forEach(([label, value], i) => {
    doc.font(FONT.body).fontSize(8.5);
    const h = Math.max(doc.heightOfString(value, { width: width - labelWidth - 6 }), 10) + 5;
    if (i % 2 === 0) doc.rect(x, cursor - 2, width, h).fill(INK.band);
    doc
      .font(FONT.bodySemibold)
      .fontSize(8.5)
      .fillColor(INK.muted)
      .text(label, x + 4, cursor + 1, { width: labelWidth - 4 });
    doc
      .font(FONT.body)
      .fontSize(8.5)
      .fillColor(INK.text)
      .text(value, x + labelWidth, cursor + 1, { width: width - labelWidth - 6 });
    cursor += h;
  });
  return cursor + 2;
}
