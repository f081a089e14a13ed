/** Draws a three-view orthographic drawing with overall dimensions into a box on a pdfkit page. */
import type { OrthographicDrawing, OrthographicView } from '../../shared/drawing/orthographicDrawing';
import { FONT } from './pdfFonts';
import { inches, MM_PER_INCH } from '../../shared/format';

/** Drawing scales offered, largest first (1:N). */
const SCALES = [1, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10];
/** Points per millimetre of paper. */
const PT_PER_MM = 72 / MM_PER_INCH;
/** Room for a dimension line and its text beside a view, points. */
const DIM_ROOM = 34;
const GAP = 26;
const INK = '#25231e';
const HIDDEN = '#a39d8e';
const DIM = '#2f5230';

/** The area to draw into, points. */
export interface DrawingBox {
  x: number;
  y: number;
  width: number;
  height: number;
}

/**
 * Draws the front view with the top view above it and the right side view beside it (third-angle arrangement), at
 * the largest standard scale that fits, with overall width, height and depth dimension lines in mm and inches.
 * @param doc - the pdfkit document
 * @param drawing - the drawing to place
 * @param box - where on the page
 * @returns the scale used (1:N)
 */
export function drawOrthographicViews(doc: PDFKit.PDFDocument, drawing: OrthographicDrawing, box: DrawingBox): number {
  const { front, side, top } = drawing;
  const needW = front.widthMm + side.widthMm;
  const needH = top.heightMm + front.heightMm;
  // Dimension lines sit left of and under the front view only; 14 pt for view labels, 12 pt for the scale note.
  const availW = box.width - GAP - DIM_ROOM;
  const availH = box.height - GAP - DIM_ROOM - 14 - 12;

  const scaleN = SCALES.find((n) => (needW * PT_PER_MM) / n <= availW && (needH * PT_PER_MM) / n <= availH) ?? 20;
  const s = PT_PER_MM / scaleN;

  const usedW = needW * s + GAP + DIM_ROOM;
  const left = box.x + (box.width - usedW) / 2 + DIM_ROOM;
  const topY = box.y + 14;
  // Page y grows downwards; a view's v grows upwards.
  const topOrigin = { x: left, y: topY + top.heightMm * s };
  const frontOrigin = { x: left, y: topY + top.heightMm * s + GAP + front.heightMm * s };
  const sideOrigin = { x: left + front.widthMm * s + GAP, y: frontOrigin.y };

  drawView(doc, top, topOrigin, s, 'TOP');
  drawView(doc, front, frontOrigin, s, 'FRONT');
  drawView(doc, side, sideOrigin, s, 'RIGHT SIDE');

  // Overall width under the front view, height left of it, depth under the side view.
  horizontalDim(doc, frontOrigin.x, frontOrigin.x + front.widthMm * s, frontOrigin.y + 12, drawing.overallMm.widthMm);
  verticalDim(doc, frontOrigin.x - 12, frontOrigin.y - front.heightMm * s, frontOrigin.y, drawing.overallMm.heightMm);
  horizontalDim(doc, sideOrigin.x, sideOrigin.x + side.widthMm * s, sideOrigin.y + 12, drawing.overallMm.depthMm);

  doc.font(FONT.body).fontSize(7.5).fillColor('#6c675b');
  doc.text(
    `Scale 1:${scaleN} on A4 at 100 %. Third-angle projection. Hidden edges dashed.`,
    box.x,
    box.y + box.height - 10,
    {
      width: box.width,
      align: 'right',
      lineBreak: false,
    },
  );
  return scaleN;
}

function drawView(
  doc: PDFKit.PDFDocument,
  view: OrthographicView,
  origin: { x: number; y: number },
  s: number,
  label: string,
): void {
  const px = (u: number) => origin.x + (u - view.minMm[0]) * s;
  const py = (v: number) => origin.y - (v - view.minMm[1]) * s;
  doc.save();
  doc.lineWidth(0.35).strokeColor(HIDDEN).dash(1.6, { space: 1.4 });
  strokeSegments(doc, view.hidden, px, py);
  doc.undash().lineWidth(0.7).strokeColor(INK);
  strokeSegments(doc, view.visible, px, py);
  doc.restore();
  doc.font(FONT.bodySemibold).fontSize(7).fillColor('#6c675b');
  doc.text(label, origin.x, origin.y - view.heightMm * s - 11, { lineBreak: false, characterSpacing: 0.8 });
}

function strokeSegments(
  doc: PDFKit.PDFDocument,
  segments: Float32Array,
  px: (u: number) => number,
  py: (v: number) => number,
): void {
  for (let i = 0; i < segments.length; i += 4)
    doc.moveTo(px(segments[i]), py(segments[i + 1])).lineTo(px(segments[i + 2]), py(segments[i + 3]));
  if (segments.length > 0) doc.stroke();
}

function dimLabel(mm: number): string {
  return `${mm.toFixed(0)} mm · ${inches(mm)} in`;
}

function horizontalDim(doc: PDFKit.PDFDocument, x1: number, x2: number, y: number, mm: number): void {
  doc.save().lineWidth(0.4).strokeColor(DIM).fillColor(DIM);
  doc
    .moveTo(x1, y - 9)
    .lineTo(x1, y + 3)
    .moveTo(x2, y - 9)
    .lineTo(x2, y + 3)
    .stroke();
  doc.moveTo(x1, y).lineTo(x2, y).stroke();
  arrow(doc, x1, y, 1, 0);
  arrow(doc, x2, y, -1, 0);
  doc.font(FONT.body).fontSize(7.5);
  const label = dimLabel(mm);
  doc.text(label, (x1 + x2) / 2 - 60, y + 3, { width: 120, align: 'center', lineBreak: false });
  doc.restore();
}

function verticalDim(doc: PDFKit.PDFDocument, x: number, y1: number, y2: number, mm: number): void {
  doc.save().lineWidth(0.4).strokeColor(DIM).fillColor(DIM);
  doc
    .moveTo(x - 3, y1)
    .lineTo(x + 9, y1)
    .moveTo(x - 3, y2)
    .lineTo(x + 9, y2)
    .stroke();
  doc.moveTo(x, y1).lineTo(x, y2).stroke();
  arrow(doc, x, y1, 0, 1);
  arrow(doc, x, y2, 0, -1);
  doc.font(FONT.body).fontSize(7.5);
  const mid = (y1 + y2) / 2;
  doc.rotate(-90, { origin: [x - 4, mid] });
  doc.text(dimLabel(mm), x - 4 - 60, mid - 9, { width: 120, align: 'center', lineBreak: false });
  doc.restore();
}

/** A filled arrowhead at (x, y) pointing along (dx, dy). */
function arrow(doc: PDFKit.PDFDocument, x: number, y: number, dx: number, dy: number): void {
  const len = 4;
  const half = 1.4;
  doc
    .moveTo(x, y)
    .lineTo(x + dx * len - dy * half, y + dy * len + dx * half)
    .lineTo(x + dx * len + dy * half, y + dy * len - dx * half)
    .closePath()
    .fill();
}
