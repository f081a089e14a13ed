/**
 * The wholesale quote as an A4 PDF for the customer: the lines, shipping, tax, total, delivery, validity and terms.
 * No production cost, margin or farm plan: those stay on the studio's own quote screen.
 */
import type { Quote } from '../../shared/schemas/quote';
import { CONTENT_WIDTH, INK, keyValueRows, PAGE, pageFooters, pageHeader, sectionHeading } from './pdfPageFrame';
import { FONT, registerPdfFonts } from './pdfFonts';
import { pdfTable } from './pdfTable';
import { pdfToBuffer } from './pdfToBuffer';
import { formatDate, formatMoney } from '../../shared/format';

const LINE_COLUMNS = [100, 221, 50, 70, 70];
/** Lowest y a table row may start at before the goods continue on a new page. */
const PAGE_BOTTOM = PAGE.height - PAGE.margin - 40;

/**
 * The tax rate as the document writes it, e.g. `20 %`, `7.25 %`.
 * @param pct - rate, percent
 */
function ratePct(pct: number): string {
  return `${Number(pct.toFixed(2))} %`;
}

/**
 * Renders a saved quote.
 * @param quote - the quote
 * @param studioName - the studio issuing it
 * @param locale - the studio's locale (BCP 47) amounts and dates are written in; the current format locale when left out
 */
export async function renderQuotePdf(quote: Quote, studioName: string, locale?: string): Promise<Buffer> {
  // Loaded on first use: the package takes a noticeable part of the server's start-up to load.
  const { default: PDFDocument } = await import('pdfkit');
  const doc = new PDFDocument({
    size: 'A4',
    margin: PAGE.margin,
    bufferPages: true,
    info: { Title: `Quote ${quote.reference} – ${quote.customerName}`, Author: studioName, Subject: 'Wholesale quote' },
  });
  registerPdfFonts(doc);
  pageHeader(doc, studioName, 'Wholesale quote');
  const x = PAGE.margin;
  doc.font(FONT.display).fontSize(22).fillColor(INK.text).text(`Quote ${quote.reference}`, x, 48);
  doc
    .font(FONT.body)
    .fontSize(10)
    .fillColor(INK.muted)
    .text(
      `For ${quote.customerName} · issued ${formatDate(quote.createdAt, locale)} · valid until ${formatDate(quote.validUntil, locale)}`,
      x,
      doc.y + 2,
    );

  const m = (cents: number) => formatMoney(cents, quote.currency, locale);
  let y = sectionHeading(doc, 'Goods', x, doc.y + 16, CONTENT_WIDTH);
  const head = ['SKU', 'Product', 'Quantity', 'Unit price', 'Line total'];
  const rows = quote.lines.map((line) => [
    line.sku,
    line.productName,
    String(line.quantity),
    m(line.unitPriceCents),
    m(line.lineTotalCents),
  ]);
  // The goods continue on a new page, under the header row again, when they do not fit.
  let start = 0;
  while (start < rows.length) {
    doc.font(FONT.body).fontSize(8);
    let end = start;
    let bottom = y + 15;
    while (end < rows.length) {
      const h = Math.max(...rows[end].map((cell, i) => doc.heightOfString(cell, { width: LINE_COLUMNS[i] - 8 }))) + 6;
      if (end > start && bottom + h > PAGE_BOTTOM) break;
      bottom += h;
      end += 1;
    }
    y = pdfTable(doc, head, rows.slice(start, end), LINE_COLUMNS, x, y);
    start = end;
    if (start < rows.length) {
      doc.addPage();
      pageHeader(doc, studioName, 'Wholesale quote');
      y = 48;
    }
  }
  const newPageIfBelow = (needed: number): void => {
    if (y + needed <= PAGE_BOTTOM) return;
    doc.addPage();
    pageHeader(doc, studioName, 'Wholesale quote');
    y = 48;
  };
  newPageIfBelow(80);
  y = keyValueRows(
    doc,
    [
      ['Goods', m(quote.subtotalCents)],
      ['Shipping', m(quote.shippingCents)],
      [`Tax at ${ratePct(quote.taxRatePct)} on goods and shipping`, m(quote.taxCents)],
      ['Total', m(quote.totalCents)],
    ],
    x,
    y + 4,
    CONTENT_WIDTH,
    220,
  );

  newPageIfBelow(90);
  y = sectionHeading(doc, 'Delivery', x, y + 12, CONTENT_WIDTH);
  y = keyValueRows(
    doc,
    [
      ['Requested delivery', formatDate(quote.deliveryDate, locale)],
      // Dates only: the farm's production plan stays on the studio's own quote screen.
      [
        'Earliest delivery',
        `${formatDate(quote.earliestDeliveryDate, locale)} (${quote.farm.leadTimeDays} days from the quote date)`,
      ],
      [
        'Can we meet the date?',
        quote.feasible
          ? 'Yes: the earliest delivery is on or before the requested date.'
          : 'Not by the requested date: we can deliver from the earliest date above, or split the order.',
      ],
      ['Prices valid until', formatDate(quote.validUntil, locale)],
    ],
    x,
    y,
    CONTENT_WIDTH,
    170,
  );

  if (quote.terms) {
    newPageIfBelow(60);
    y = sectionHeading(doc, 'Terms', x, y + 12, CONTENT_WIDTH);
    doc.font(FONT.body).fontSize(9).fillColor(INK.text).text(quote.terms, x, y, { width: CONTENT_WIDTH });
    y = doc.y;
  }

  newPageIfBelow(40);
  doc.font(FONT.body).fontSize(8).fillColor(INK.muted);
  doc.text(
    'Delivery dates are estimated on the quote date; we confirm them when the order is placed. ' +
      'The spec sheet of each product gives its sizes, the birds it suits, care and cautions.',
    x,
    y + 14,
    { width: CONTENT_WIDTH },
  );
  pageFooters(doc, `${studioName} · quote ${quote.reference}`);
  return pdfToBuffer(doc);
}
