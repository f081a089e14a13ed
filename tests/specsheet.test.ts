/**
 * Spec sheets read back with Debian's pdftotext: SKU, entry hole in mm and inches, cautions, care, species with
 * sources, shipping weights under the configured divisors; fonts embedded from the app's @fontsource packages;
 * overall dimensions equal to the drawing (the drawing itself is checked against admesh in drawing.test.ts).
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { orthographicDrawing } from '../shared/drawing/orthographicDrawing';
import { woffToSfnt } from '../server/pdf/woffToSfnt';
import { productMesh } from '../server/services/specSheetMesh';
import { FIXTURE_SKUS } from './salesFixtures';
import { binaryBody, useSalesTestApp } from './setup/salesTestApp';

const suite = useSalesTestApp();

/** Writes the PDF to a temporary file and returns its path. */
function savePdf(bytes: Buffer): string {
  const file = join(mkdtempSync(join(tmpdir(), 'specsheet-')), 'sheet.pdf');
  writeFileSync(file, bytes);
  return file;
}

const run = (cmd: string, args: string[]) => execFileSync(cmd, args, { encoding: 'utf8' });
/** pdftotext output with line breaks folded to spaces, so wrapped phrases still match. */
const flat = (text: string) => text.replace(/\s+/g, ' ');

describe('variant spec sheet', () => {
  let file: string;
  let text: string;

  beforeAll(async () => {
    const sales = await suite.t.agent('sales');
    const res = await sales.get(`/api/variants/${FIXTURE_SKUS[0]}/spec-sheet.pdf`).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    expect(res.headers['content-disposition']).toContain(`spec-sheet-${FIXTURE_SKUS[0]}.pdf`);
    file = savePdf(res.body as Buffer);
    text = flat(run('pdftotext', ['-raw', file, '-']));
  }, 60_000);

  it('holds the SKU and the entry hole in millimetres and inches', () => {
    expect(text).toContain(FIXTURE_SKUS[0]);
    // 28 mm = 1.10 in (1 in = 25.4 mm)
    expect(text).toContain('28 mm (1.10 in)');
  });

  it('holds the hole height, material and colour, mass, back fit and price', () => {
    const facts = suite.fixture.variants[0].report.facts;
    expect(text).toContain(
      `${Math.round(facts.holeAboveFloorMm)} mm (${(facts.holeAboveFloorMm / 25.4).toFixed(2)} in)`,
    );
    expect(text).toContain('PLA, Sand');
    expect(text).toContain(`${Math.round(suite.fixture.variants[0].report.massG)} g`);
    expect(text).toMatch(/Flat back/);
    expect(text).toMatch(/€\d+\.\d{2} per unit/);
  });

  it('holds the cautions (heat, perches, mounting height, predator guards, local rules) and the care', () => {
    for (const title of ['Heat.', 'Perches.', 'Mounting height.', 'Predator guards.', 'Local rules.'])
      expect(text).toContain(title);
    expect(text).toContain('41.7 °C'); // Audubon (2024): > 107 °F (41.7 °C) is lethal to nestlings
    expect(text).toMatch(/perch under the entry/); // USFWS "For the Birds"
    expect(text).toMatch(/outside only/); // NestWatch FAQ: paint the exterior only
    expect(text).toMatch(/once a year/);
  });

  it('prints the roof and wall sol-air temperatures of its colour beside the heat-deflection temperature, in °C and °F', () => {
    // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) (T_sa = T_o + α·I/h_o − ε·ΔR/h_o; h_o 17, 30 °C air, roof 1000 W/m²
    // with −3.9 K, wall 600 W/m²) with sand's estimated α 0.40 (shared/production/defaults.ts, colour classes of the published absorptance tables)
    const roofC = 30 + (0.4 * 1000) / 17 - 3.9; // 49.6 °C
    const wallC = 30 + (0.4 * 600) / 17; // 44.1 °C
    const cf = (c: number, d = 1) => `${c.toFixed(d)} °C (${((c * 9) / 5 + 32).toFixed(0)} °F)`;
    expect(text).toContain(`${cf(roofC)} / ${cf(wallC)}`); // key figures, page 1
    // source: PLA heat-deflection temperature at 0.45 MPa — 55 °C (= 131 °F)
    expect(text).toContain('55 °C (131 °F), PLA at 0.45 MPa');
    // The heat caution repeats them and, with the roof within the 10 K margin, advises shade; it defers to local advice.
    expect(text).toContain(`reaches about ${cf(roofC)} on the roof and ${cf(wallC)} on the walls`);
    expect(text).toMatch(/The roof comes within 5 K of it: prefer a shaded site/);
    expect(text).toMatch(/follow local advice/);
  });

  it('names the species it suits with the source of the guidance', () => {
    // source: RSPB — great tit hole 28 mm, so a 28 mm box suits it
    expect(text).toContain('Great tit (Parus major)');
    expect(text).toMatch(/\[1\] .*RSPB|\[2\] .*RSPB/);
  });

  it('gives the shipping box with actual and dimensional weight under each divisor and its date', () => {
    expect(text).toMatch(/Box, outside \(L × W × H\) \d+ × \d+ × \d+ mm \([\d.]+ × [\d.]+ × [\d.]+ in\)/);
    expect(text).toContain('139 in³/lb (2017-01-01)'); // UPS help centre, Determine billable weight
    expect(text).toContain('5000 cm³/kg'); // UPS metric dimensional-weight page
    expect(text).toMatch(/Actual weight [\d.]+ (g|kg) \([\d.]+ lb\)/);
  });

  it('gives overall dimensions equal to the drawing of the same parameters', async () => {
    const { mesh } = await productMesh('gable-box', suite.fixture.variants[0].params);
    const o = orthographicDrawing(mesh).overallMm;
    const triple = `${o.widthMm.toFixed(0)} × ${o.depthMm.toFixed(0)} × ${o.heightMm.toFixed(0)} mm`;
    expect(text).toContain(triple);
    expect(text).toContain(`${o.widthMm.toFixed(0)} mm · ${(o.widthMm / 25.4).toFixed(2)} in`); // dimension line
  });

  it('embeds the fonts the app ships, and no others', () => {
    const fonts = run('pdffonts', [file]);
    expect(fonts).toMatch(/SourceSans3/);
    expect(fonts).toMatch(/Fraunces/);
    expect(fonts).not.toMatch(/Helvetica/);
    for (const line of fonts.split('\n').slice(2).filter(Boolean)) expect(line).toMatch(/ yes /); // embedded
  });

  it('renders to PNG (pdftoppm): two A4 pages, the first with the box drawn in the colour the sheet names', async () => {
    const out = mkdtempSync(join(tmpdir(), 'nestwright-specsheet-'));
    run('pdftoppm', ['-png', '-r', '60', file, join(out, 'page')]);
    expect(run('pdfinfo', [file])).toMatch(/Pages:\s+2/);
    const pages = readdirSync(out)
      .filter((f) => f.endsWith('.png'))
      .sort();
    expect(pages).toHaveLength(2);
    const hex = /Colour sample: [^(]+\(#([0-9a-f]{6})\)/i.exec(text)?.[1];
    expect(hex).toBeDefined();
    const colour = [0, 2, 4].map((i) => parseInt(hex!.slice(i, i + 2), 16));
    const { default: sharp } = await import('sharp');
    const looks = [];
    for (const page of pages) {
      const { data, info } = await sharp(join(out, page)).removeAlpha().raw().toBuffer({ resolveWithObject: true });
      // source: ISO 216 (A4 is 210 × 297 mm); at 60 dpi that is 496.1 × 701.6 px, and pdftoppm rounds to a whole pixel
      expect(Math.abs(info.width - (210 / 25.4) * 60)).toBeLessThanOrEqual(1);
      expect(Math.abs(info.height - (297 / 25.4) * 60)).toBeLessThanOrEqual(1);
      let shaded = 0;
      let dark = 0;
      for (let i = 0; i < data.length; i += 3) {
        const px = [data[i]!, data[i + 1]!, data[i + 2]!];
        if (Math.max(...px) < 100) dark++;
        // Lit or shaded, a surface of the colour keeps its RGB direction (a lighter or darker shade of the same
        // hue); page white, greys and the pale table fills point elsewhere.
        const dot = px[0]! * colour[0]! + px[1]! * colour[1]! + px[2]! * colour[2]!;
        if (Math.max(...px) <= 235 && dot / (Math.hypot(...px) * Math.hypot(...colour)) > 0.9995) shaded++;
      }
      const area = info.width * info.height;
      looks.push({ shaded: shaded / area, dark: dark / area });
    }
    // Page one shows the rendered box in its colour (about 2.5 % of the page at the time of writing); page two has
    // no picture. Thresholds from looking at the sheet; no outside source.
    expect(looks[0]!.shaded).toBeGreaterThan(0.015);
    expect(looks[1]!.shaded).toBeLessThan(0.002);
    // Both pages carry dark text and lines.
    for (const look of looks) expect(look.dark).toBeGreaterThan(0.005);
  });
});

describe('family spec sheet and errors', () => {
  it('puts every published variant of the family in one PDF, two pages each', async () => {
    const manager = await suite.t.agent('catalogue_manager');
    const res = await manager
      .get(`/api/families/${suite.fixture.familyId}/spec-sheet.pdf`)
      .buffer(true)
      .parse(binaryBody);
    expect(res.status).toBe(200);
    const file = savePdf(res.body as Buffer);
    expect(run('pdfinfo', [file])).toMatch(new RegExp(`Pages:\\s+${2 * suite.fixture.variants.length}\\b`));
    const text = flat(run('pdftotext', ['-raw', file, '-']));
    for (const sku of FIXTURE_SKUS) expect(text).toContain(sku);
    expect(text).toContain('32 mm (1.26 in)'); // 32 / 25.4 = 1.26
    // source: ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals) with moss green's estimated α 0.65: roof 30 + 0.65·1000/17 − 3.9
    // = 64.3 °C (148 °F), above PLA's 55 °C (NatureWorks Ingeo 2003D data sheet), so the sheet says it may sag
    expect(text).toContain('64.3 °C (148 °F)');
    expect(text).toMatch(/The roof can pass that temperature and may sag or warp/);
  }, 60_000);

  it("shows the family's sample-print photo instead of the rendered view once one is uploaded", async () => {
    const designer = await suite.t.agent('designer');
    // a small PNG "photo" made with sharp
    const sharp = (await import('sharp')).default;
    const png = await sharp({ create: { width: 240, height: 180, channels: 3, background: '#8a6649' } })
      .png()
      .toBuffer();
    const uploaded = await designer
      .post(`/api/families/${suite.fixture.familyId}/photos`)
      .attach('photo', png, 'sample.png');
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    const sales = await suite.t.agent('sales');
    const res = await sales.get(`/api/variants/${FIXTURE_SKUS[1]}/spec-sheet.pdf`).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    const text = flat(run('pdftotext', ['-raw', savePdf(res.body as Buffer), '-']));
    expect(text).toContain('Photo of the sample print');
    expect(text).not.toContain('Rendered view');
  }, 60_000);

  it('answers 404 for an unknown SKU or family', async () => {
    const sales = await suite.t.agent('sales');
    expect((await sales.get('/api/variants/FH-NOPE-1/spec-sheet.pdf')).status).toBe(404);
    expect((await sales.get('/api/families/no-such-family/spec-sheet.pdf')).status).toBe(404);
  });
});

describe('woffToSfnt', () => {
  // fontkit (pdfkit's font reader, an outside library) opens both the WOFF and the unwrapped font; they must agree.
  const require = createRequire(import.meta.url);
  const fontkit = require('fontkit') as {
    create(bytes: Buffer): {
      numGlyphs: number;
      postscriptName: string;
      type: string;
      glyphForCodePoint(cp: number): { advanceWidth: number };
    };
  };
  it.each([
    '@fontsource/source-sans-3/files/source-sans-3-latin-400-normal.woff',
    '@fontsource/fraunces/files/fraunces-latin-600-normal.woff',
    '@fontsource/jetbrains-mono/files/jetbrains-mono-latin-400-normal.woff',
  ])('%s unwraps to the same font', (file) => {
    const woff = readFileSync(require.resolve(file));
    const packed = fontkit.create(woff);
    const plain = fontkit.create(woffToSfnt(woff));
    expect(packed.type).toBe('WOFF');
    expect(plain.type).toBe('TTF');
    expect(plain.numGlyphs).toBe(packed.numGlyphs);
    expect(plain.postscriptName).toBe(packed.postscriptName);
    for (const ch of 'SKU 32 mm (1.26 in) €×³') {
      expect(plain.glyphForCodePoint(ch.codePointAt(0)!).advanceWidth).toBe(
        packed.glyphForCodePoint(ch.codePointAt(0)!).advanceWidth,
      );
    }
  });
});
