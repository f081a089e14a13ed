/**
 * Converting the editor's length fields between millimetres and inches. Lengths are written for people through
 * shared/format (`formatLength`, and its one inch rule: two more decimals than the millimetres); this module keeps
 * what is particular to the editor: field values and help texts.
 */
import { formatLength, inchDecimals, inches, MM_PER_INCH, writtenDecimals } from '../../../shared/format';

/** Decimals the editor's millimetre lengths are set to: a tenth of a millimetre, about one print layer step. */
export const FIELD_MM_DECIMALS = 1;

/** Decimals an inch field is shown with, by the one inch rule: thousandths (0.001 in = 0.0254 mm). */
export const INCH_DECIMALS = inchDecimals(FIELD_MM_DECIMALS);

/**
 * A length parameter's value as shown: millimetres, or inches when the designer chose inches.
 * @param valueMm - the value in millimetres
 * @param display - how lengths are shown
 */
export function toDisplayLength(valueMm: number, display: 'mm' | 'in'): number {
  return display === 'in' ? valueMm / MM_PER_INCH : valueMm;
}

/**
 * A shown length converted back to millimetres, rounded to 0.01 mm so inch input does not leave float dust.
 * @param shown - the value as typed or dragged
 * @param display - how lengths are shown
 */
export function fromDisplayLength(shown: number, display: 'mm' | 'in'): number {
  const mm = display === 'in' ? shown * MM_PER_INCH : shown;
  return Math.round(mm * 100) / 100;
}

/** A length written in millimetres inside a sentence: `32 mm`, `28–32 mm`, `0.6 mm` (not mm² or mm³). */
const MM_IN_TEXT = /(\d+(?:\.\d+)?)(?:\s*[–-]\s*(\d+(?:\.\d+)?))?\s?mm(?![²³\w])/g;

/**
 * A sentence (help text, a caution) with every millimetre length in it written in the chosen display unit, so a
 * screen in inches never mixes in millimetres: `over about 180 mm` → `over about 7.09 in` (each figure by the one
 * inch rule: two more decimals than it was written with).
 * @param text - the sentence, lengths in millimetres
 * @param display - how lengths are shown
 */
export function lengthsInText(text: string, display: 'mm' | 'in'): string {
  if (display === 'mm') return text;
  const inch = (mm: string) => inches(Number(mm), writtenDecimals(mm));
  return text.replace(MM_IN_TEXT, (_whole, from: string, to: string | undefined) =>
    to === undefined ? `${inch(from)} in` : `${inch(from)}–${inch(to)} in`,
  );
}

/**
 * How a printed wall is built, in the chosen display unit: `1.4 mm solid perimeters, 2.6 mm infill core`.
 * @param skinThicknessMm - both faces' solid perimeters together, millimetres
 * @param coreThicknessMm - the infill core between them, millimetres
 * @param display - how lengths are shown
 */
export function wallBuildText(skinThicknessMm: number, coreThicknessMm: number, display: 'mm' | 'in'): string {
  return `${formatLength(skinThicknessMm, display)} solid perimeters, ${formatLength(coreThicknessMm, display)} infill core`;
}
