/**
 * The fonts the app ships (@fontsource packages), registered on a pdfkit document. @fontsource ships WOFF and WOFF2;
 * the latin WOFF files are unwrapped once to plain fonts (pdfkit reads those much faster) and embedded as subsets.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type PDFDocument from 'pdfkit';
import { woffToSfnt } from './woffToSfnt';

const require = createRequire(import.meta.url);

/** Font names to pass to `doc.font()`. */
export const FONT = {
  body: 'SourceSans3',
  bodySemibold: 'SourceSans3-Semibold',
  bodyBold: 'SourceSans3-Bold',
  display: 'Fraunces-Semibold',
  mono: 'JetBrainsMono',
} as const;

const FILES: Record<(typeof FONT)[keyof typeof FONT], string> = {
  [FONT.body]: '@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff',
  [FONT.bodySemibold]: '@fontsource/source-sans-3/files/source-sans-3-latin-600-normal.woff',
  [FONT.bodyBold]: '@fontsource/source-sans-3/files/source-sans-3-latin-700-normal.woff',
  [FONT.display]: '@fontsource/fraunces/files/fraunces-latin-600-normal.woff',
  [FONT.mono]: '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff',
};

/**
 * Registers every shipped font on the document and selects the body font.
 * @param doc - a new pdfkit document
 */
export function registerPdfFonts(doc: PDFKit.PDFDocument): void {
  fonts ??= Object.entries(FILES).map(
    ([name, file]) => [name, woffToSfnt(readFileSync(require.resolve(file)))] as const,
  );
  for (const [name, bytes] of fonts) doc.registerFont(name, bytes);
  doc.font(FONT.body);
}

/** The unwrapped fonts, read once per process. */
let fonts: ReadonlyArray<readonly [string, Buffer]> | undefined;

/** The pdfkit document type, re-exported for modules that only draw. */
export type PdfDoc = InstanceType<typeof PDFDocument>;

/** Characters the shipped latin font subsets lack, and what to print instead. */
const MISSING_GLYPHS: Record<string, string> = {
  '≥': '>=',
  '≤': '<=',
  '→': '->',
  '≈': '~',
  '⅛': '1/8',
  '⅜': '3/8',
  '⅝': '5/8',
  '⅞': '7/8',
};

/**
 * Text with the characters the shipped fonts cannot show replaced by plain equivalents (`≥` -> `>=`), for text that
 * comes from data (sources, warnings) rather than from the document's own wording.
 * @param text - any text
 */
export function pdfText(text: string): string {
  return text.replace(/[≥≤→≈⅛⅜⅝⅞]/g, (ch) => MISSING_GLYPHS[ch] ?? ch);
}
