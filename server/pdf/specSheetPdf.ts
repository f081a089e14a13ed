/** The spec sheet: a two-page A4 document per variant that a buyer can check a nest box against. */
import type { OrthographicDrawing } from '../../shared/drawing/orthographicDrawing';
import type { DimWeight, ShippingBox } from '../../shared/schemas/shipping';
import { drawOrthographicViews } from './drawOrthographicViews';
import { CONTENT_WIDTH, INK, keyValueRows, PAGE, pageFooters, pageHeader, sectionHeading } from './pdfPageFrame';
import { FONT, registerPdfFonts } from './pdfFonts';
import { pdfToBuffer } from './pdfToBuffer';
import { pdfTable } from './pdfTable';
import { formatCelsiusFahrenheit, formatDate, formatMassGLb, formatMmIn, formatMmInTriple } from '../../shared/format';

/** One species the variant suits, with a reference into `sources`. */
export interface SpecSheetSpecies {
  commonName: string;
  scientificName: string;
  region: string;
  mountingHeightM: { min: number; max: number };
  /** Index into {@link SpecSheetInput.sources}. */
  sourceIndex: number;
}

/** A caution with where its guidance comes from. */
export interface SpecSheetCaution {
  title: string;
  text: string;
  source: string;
}

/** Sun heat of the variant's colour: sol-air roof and wall temperatures beside the heat-deflection temperature. */
export interface SpecSheetOutdoor {
  roofC: number;
  wallC: number;
  heatDeflectionC: number;
  /** Outdoor air of the case, °C (a clear summer noon). */
  airC: number;
}

/** Everything one spec sheet shows, gathered by the spec-sheet service. */
export interface SpecSheetInput {
  studioName: string;
  /** The studio's locale (BCP 47) the issue date is written in; the current format locale when left out. */
  locale?: string;
  sku: string;
  productName: string;
  familyName: string;
  templateName: string;
  /** When the sheet was made (printed on it). */
  issuedOn: Date;
  /** A PNG: photo of the sample print, or a rendered view. */
  picturePng: Buffer;
  pictureCaption: string;
  drawing: OrthographicDrawing;
  entryHoleDiameterMm: number;
  holeAboveFloorMm: number;
  floorWidthMm: number;
  floorDepthMm: number;
  cavityDepthMm: number;
  wallThicknessMm: number;
  material: string;
  colour: { name: string; hex: string };
  /** Sun heat of this colour; omitted when the material is unknown. */
  outdoor?: SpecSheetOutdoor;
  massG: number;
  /** Which poles, trunks or posts the back fits. */
  backFit: string;
  /** Unit price line, e.g. `€24.00 per unit, before tax`; omitted when the sheet carries no price. */
  priceText?: string;
  species: SpecSheetSpecies[];
  sources: string[];
  box: ShippingBox;
  weights: DimWeight[];
  care: string[];
  cautions: SpecSheetCaution[];
}

/**
 * Renders spec sheets (one or more variants, two pages each) into one PDF with the app's fonts.
 * @param sheets - the sheets, in order
 * @returns the PDF bytes
 */
export async function renderSpecSheetsPdf(sheets: SpecSheetInput[]): Promise<Buffer> {
  const first = sheets[0];
  // Loaded on first use: the package takes a noticeable part of the server's start-up to load.
  const { default: PDFDocument } = await import('pdfkit');
  const doc = new PDFDocument({
    size: 'A4',
    margin: PAGE.margin,
    bufferPages: true,
    autoFirstPage: false,
    info: {
      Title:
        sheets.length === 1 ? `Spec sheet ${first.sku} – ${first.productName}` : `Spec sheets – ${first.familyName}`,
      Author: first?.studioName ?? 'Nestwright',
      Subject: 'Product specification',
    },
  });
  registerPdfFonts(doc);
  for (const sheet of sheets) {
    productPage(doc, sheet);
    detailsPage(doc, sheet);
  }
  pageFooters(
    doc,
    `${first.studioName} · figures are estimates from the design; confirm with a test print · issued ${formatDate(first.issuedOn, first.locale)}`,
  );
  return pdfToBuffer(doc);
}

/** Page 1: title block, picture, key figures, the dimensioned drawing. */
function productPage(doc: PDFKit.PDFDocument, s: SpecSheetInput): void {
  doc.addPage();
  pageHeader(doc, s.studioName, 'Product specification');
  const x = PAGE.margin;
  doc
    .font(FONT.display)
    .fontSize(22)
    .fillColor(INK.text)
    .text(s.productName, x, 48, { width: CONTENT_WIDTH - 150 });
  const afterTitle = doc.y;
  doc
    .font(FONT.mono)
    .fontSize(10)
    .fillColor(INK.accent)
    .text(`SKU ${s.sku}`, x, afterTitle + 2, { lineBreak: false });
  doc.font(FONT.body).fontSize(9).fillColor(INK.muted);
  doc.text(`${s.familyName} family · ${s.templateName} template`, x, afterTitle + 16, { lineBreak: false });
  doc.rect(PAGE.width - PAGE.margin - 140, 50, 140, 38).fill(INK.band);
  doc
    .font(FONT.body)
    .fontSize(7.5)
    .fillColor(INK.muted)
    .text('ENTRY HOLE', PAGE.width - PAGE.margin - 134, 55, { lineBreak: false, characterSpacing: 0.8 });
  doc.font(FONT.bodyBold).fontSize(12).fillColor(INK.text);
  doc.text(formatMmIn(s.entryHoleDiameterMm), PAGE.width - PAGE.margin - 134, 66, { width: 130, lineBreak: false });

  const top = afterTitle + 36;
  const pictureW = 200;
  const pictureH = 180;
  doc.rect(x, top, pictureW, pictureH).fill('#fcfaf4');
  doc.image(s.picturePng, x + 8, top + 8, { fit: [pictureW - 16, pictureH - 24], align: 'center', valign: 'center' });
  doc
    .font(FONT.body)
    .fontSize(7)
    .fillColor(INK.muted)
    .text(s.pictureCaption, x + 6, top + pictureH - 12, { width: pictureW - 12, lineBreak: false });

  const colX = x + pictureW + 18;
  const colW = CONTENT_WIDTH - pictureW - 18;
  let y = sectionHeading(doc, 'Key figures', colX, top, colW);
  const o = s.drawing.overallMm;
  y = keyValueRows(
    doc,
    [
      ['Entry hole', `${formatMmIn(s.entryHoleDiameterMm)} diameter`],
      ['Hole above floor', `${formatMmIn(s.holeAboveFloorMm)} to the lower edge of the hole`],
      ['Overall size (W × D × H)', formatMmInTriple([o.widthMm, o.depthMm, o.heightMm])],
      ['Inside floor', formatMmInTriple([s.floorWidthMm, s.floorDepthMm])],
      ['Inside height', formatMmIn(s.cavityDepthMm)],
      ['Wall thickness', formatMmIn(s.wallThicknessMm)],
      ['Material and colour', `${s.material}, ${s.colour.name} (printed, material extrusion)`],
      ...(s.outdoor
        ? ([
            [
              'In full sun, roof / wall',
              `${formatCelsiusFahrenheit(s.outdoor.roofC)} / ${formatCelsiusFahrenheit(s.outdoor.wallC)} in ${s.colour.name.toLowerCase()} (estimate, ${s.outdoor.airC} °C air)`,
            ],
            ['Heat deflection', `${formatCelsiusFahrenheit(s.outdoor.heatDeflectionC, 0)}, ${s.material} at 0.45 MPa`],
          ] as Array<[string, string]>)
        : []),
      ['Mass', formatMassGLb(s.massG)],
      ['Back fits', s.backFit],
      ...(s.priceText ? ([['Price', s.priceText]] as Array<[string, string]>) : []),
    ],
    colX,
    y,
    colW,
    104,
  );
  doc.rect(colX, y + 2, 10, 10).fill(s.colour.hex);
  doc
    .rect(colX, y + 2, 10, 10)
    .lineWidth(0.4)
    .strokeColor(INK.rule)
    .stroke();
  doc
    .font(FONT.body)
    .fontSize(7.5)
    .fillColor(INK.muted)
    .text(`Colour sample: ${s.colour.name} (${s.colour.hex})`, colX + 15, y + 3.5, { lineBreak: false });

  const drawTop = Math.max(top + pictureH, y + 16) + 8;
  const headY = sectionHeading(doc, 'Dimensioned drawing', x, drawTop, CONTENT_WIDTH);
  drawOrthographicViews(doc, s.drawing, {
    x,
    y: headY,
    width: CONTENT_WIDTH,
    height: PAGE.height - PAGE.margin - 16 - headY,
  });
}

/** Page 2: the birds, shipping, care and cautions. */
function detailsPage(doc: PDFKit.PDFDocument, s: SpecSheetInput): void {
  doc.addPage();
  pageHeader(doc, s.studioName, `Product specification · ${s.sku}`);
  const x = PAGE.margin;
  let y = sectionHeading(doc, 'Birds it suits', x, 48, CONTENT_WIDTH);
  if (s.species.length === 0) {
    doc
      .font(FONT.body)
      .fontSize(8.5)
      .fillColor(INK.text)
      .text('No species in our table matches every measure of this box.', x, y);
    y = doc.y + 6;
  } else {
    y = pdfTable(
      doc,
      ['Species', 'Region', 'Mounting height', 'Source'],
      s.species.map((sp) => [
        `${sp.commonName} (${sp.scientificName})`,
        sp.region === 'north-america' ? 'North America' : sp.region === 'europe' ? 'Europe' : sp.region,
        `${sp.mountingHeightM.min}–${sp.mountingHeightM.max} m (${(sp.mountingHeightM.min / 0.3048).toFixed(0)}–${(sp.mountingHeightM.max / 0.3048).toFixed(0)} ft)`,
        `[${sp.sourceIndex + 1}]`,
      ]),
      [190, 90, 150, 81],
      x,
      y,
    );
  }
  doc.font(FONT.body).fontSize(7).fillColor(INK.muted);
  s.sources.forEach((source, i) => {
    doc.text(`[${i + 1}] ${source}`, x, y, { width: CONTENT_WIDTH });
    y = doc.y + 1;
  });

  y = sectionHeading(doc, 'Shipping', x, y + 10, CONTENT_WIDTH);
  y = keyValueRows(
    doc,
    [
      ['Box, outside (L × W × H)', formatMmInTriple(s.box.outerMm)],
      ['Box, inside', formatMmInTriple(s.box.innerMm)],
      [
        'Actual weight',
        `${formatMassGLb(s.box.actualMassG)}: product ${formatMassGLb(s.massG)} + carton and fill ${formatMassGLb(s.box.packagingMassG)}`,
      ],
    ],
    x,
    y,
    CONTENT_WIDTH,
    130,
  );
  y = pdfTable(
    doc,
    ['Dimensional weight rule', 'Divisor (since)', 'Rounded box', 'DIM weight', 'Actual', 'Billable'],
    s.weights.map((w) => {
      const unit = w.unitSystem === 'imperial' ? 'in' : 'cm';
      const volUnit = w.unitSystem === 'imperial' ? 'in³/lb' : 'cm³/kg';
      return [
        w.label,
        `${w.divisor} ${volUnit} (${w.effectiveFrom})`,
        `${w.roundedDimensions.join(' × ')} ${unit}`,
        w.dimWeight === 0 ? 'not applied' : `${w.dimWeight} ${w.weightUnit} (${w.dimWeightExact.toFixed(2)})`,
        `${w.actualWeight} ${w.weightUnit}`,
        `${w.billableWeight} ${w.weightUnit}`,
      ];
    }),
    [140, 95, 90, 80, 50, 56],
    x,
    y + 4,
  );
  doc.font(FONT.body).fontSize(7).fillColor(INK.muted);
  doc.text(
    'Each outside dimension is rounded to the nearest whole inch or centimetre; DIM weight = L × W × H ÷ divisor, rounded up to the next whole pound or kilogram; billable weight is the larger of DIM and actual weight, both rounded up. Divisors depend on carrier and contract and change over time: check yours.',
    x,
    y,
    { width: CONTENT_WIDTH },
  );
  y = doc.y + 10;

  y = sectionHeading(doc, 'Care', x, y, CONTENT_WIDTH);
  y = bullets(doc, s.care, x, y);

  y = sectionHeading(doc, 'Cautions', x, y + 8, CONTENT_WIDTH);
  for (const caution of s.cautions) {
    doc
      .font(FONT.bodyBold)
      .fontSize(8.5)
      .fillColor(INK.text)
      .text(`${caution.title}. `, x, y, { width: CONTENT_WIDTH, continued: true });
    doc.font(FONT.body).text(caution.text, { continued: caution.source !== '' });
    if (caution.source !== '') doc.fillColor(INK.muted).fontSize(7.5).text(`  Source: ${caution.source}`);
    y = doc.y + 4;
  }
}

function bullets(doc: PDFKit.PDFDocument, lines: string[], x: number, y: number): number {
  let cursor = y;
  for (const line of lines) {
    doc
      .font(FONT.body)
      .fontSize(8.5)
      .fillColor(INK.accent)
      .text('•', x + 2, cursor, { lineBreak: false });
    doc.fillColor(INK.text).text(line, x + 12, cursor, { width: CONTENT_WIDTH - 12 });
    cursor = doc.y + 2;
  }
  return cursor;
}
