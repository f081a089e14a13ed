/** The wholesale quote as a one-page A4 PDF for the customer (prices and delivery; no costs or margins). */
import type { Quote } from '../../shared/schemas/quote';
import { money } from './formatMeasure';
import { CONTENT_WIDTH, INK, keyValueRows, PAGE, pageFooters, pageHeader, sectionHeading } from './pdfPageFrame';
import { FONT, registerPdfFonts } from './pdfFonts';
import { pdfTable } from './pdfTable';
import { pdfToBuffer } from './pdfToBuffer';

/**
 * Renders a saved quote.
 * @param quote - the quote
 * @param studioName - the studio issuing it
 */
export async function renderQuotePdf(quote: Quote, studioName: string): Promise<Buffer> {
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
    .text(`For ${quote.customerName} · issued ${quote.createdAt.slice(0, 10)}`, x, doc.y + 2);

  const m = (cents: number) => money(cents, quote.currency);
  let y = sectionHeading(doc, 'Goods', x, doc.y + 16, CONTENT_WIDTH);
  y = pdfTable(
    doc,
    ['SKU', 'Product', 'Quantity', 'Unit price', 'Total'],
    [[quote.sku, quote.productName, String(quote.quantity), m(quote.unitPriceCents), m(quote.totalPriceCents)]],
    [110, 201, 60, 70, 70],
    x,
    y,
  );
  y = keyValueRows(
    doc,
    [
      ['List price per unit', m(quote.listPriceCents)],
      ['Quantity discount', quote.discountPct > 0 ? `${quote.discountPct} %` : 'none at this quantity'],
      ['Total, before tax and shipping', m(quote.totalPriceCents)],
    ],
    x,
    y + 4,
    CONTENT_WIDTH,
    170,
  );

  y = sectionHeading(doc, 'Delivery', x, y + 12, CONTENT_WIDTH);
  y = keyValueRows(
    doc,
    [
      ['Requested delivery', quote.deliveryDate],
      // The customer's copy gives dates only: the farm's production plan (plates, printers, failure allowance) stays
      // on the studio's own quote screen.
      ['Earliest delivery', `${quote.earliestDeliveryDate} (${quote.farm.leadTimeDays} days from the quote date)`],
      [
        'Can we meet the date?',
        quote.feasible
          ? 'Yes: the earliest delivery is on or before the requested date.'
          : 'Not by the requested date: we can deliver from the earliest date above, or split the order.',
      ],
    ],
    x,
    y,
    CONTENT_WIDTH,
    170,
  );

  if (quote.breaks.length > 0) {
    y = sectionHeading(doc, 'Quantity prices', x, y + 12, CONTENT_WIDTH);
    y = pdfTable(
      doc,
      ['From quantity', 'Discount', 'Unit price'],
      [
        ['1', '0 %', m(quote.listPriceCents)],
        ...quote.breaks.map((b) => [String(b.minQuantity), `${b.discountPct} %`, m(b.unitPriceCents)]),
      ],
      [140, 140, 140],
      x,
      y,
    );
  }

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
