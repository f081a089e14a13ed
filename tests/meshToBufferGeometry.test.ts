/**
 * The viewer's seam: the neutral indexed mesh becomes a flat-shaded BufferGeometry with one colour per triangle, so
 * overhang faces can be shaded. Checked on a unit cube (analytic: 12 triangles, outward normals, area 6).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { type BufferAttribute, Color } from 'three';
import {
  meshToBufferGeometry,
  updateBufferGeometry,
  OVERHANG_MILD_HEX,
  OVERHANG_STEEP_HEX,
  overhangRgb,
  SURFACE_RGB,
} from '../src/components/viewer/meshToBufferGeometry';
import {
  fromDisplayLength,
  INCH_DECIMALS,
  lengthsInText,
  toDisplayLength,
  wallBuildText,
} from '../src/components/editor/lengthUnits';
import { formatLength } from '../shared/format';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { applyPaletteVariables } from '../src/styles/palette';

/** A 10 mm cube, counter-clockwise seen from outside. */
function cube(): IndexedMesh {
  const s = 10;
  const positions = new Float32Array([0, 0, 0, s, 0, 0, s, s, 0, 0, s, 0, 0, 0, s, s, 0, s, s, s, s, 0, s, s]);
  const indices = new Uint32Array([
    0,
    2,
    1,
    0,
    3,
    2, // bottom (-z)
    4,
    5,
    6,
    4,
    6,
    7, // top (+z)
    0,
    1,
    5,
    0,
    5,
    4, // front (-y)
    1,
    2,
    6,
    1,
    6,
    5, // right (+x)
    2,
    3,
    7,
    2,
    7,
    6, // back (+y)
    3,
    0,
    4,
    3,
    4,
    7, // left (-x)
  ]);
  return { positions, indices };
}

describe('meshToBufferGeometry', () => {
  it('unrolls every triangle with its outward face normal', () => {
    const geometry = meshToBufferGeometry(cube());
    const position = geometry.getAttribute('position');
    const normal = geometry.getAttribute('normal');
    expect(position.count).toBe(36);
    // First two triangles are the bottom face: normal (0, 0, -1) on all six vertices.
    for (let v = 0; v < 6; v++) expect([normal.getX(v), normal.getY(v), normal.getZ(v)]).toEqual([0, 0, -1]);
    for (let v = 6; v < 12; v++) expect(normal.getZ(v)).toBeCloseTo(1, 12);
    // Bounding box equals the cube (analytic).
    expect(geometry.boundingBox!.max.toArray()).toEqual([10, 10, 10]);
    geometry.dispose();
  });

  it('tints masked triangles by steepness (rust facing straight down) and the rest in the filament colour', () => {
    const mask = new Uint8Array(12);
    mask[0] = 1;
    mask[1] = 1; // the bottom face, facing straight down: an overhang if it were not on the plate
    const geometry = meshToBufferGeometry(cube(), mask, { surfaceHex: '#5f6f3a' });
    const color = geometry.getAttribute('color');
    // three.js converts sRGB hex to linear RGB (IEC 61966-2-1 transfer function).
    const steep = new Color(OVERHANG_STEEP_HEX);
    const moss = new Color('#5f6f3a');
    for (let v = 0; v < 6; v++) expect(color.getX(v)).toBeCloseTo(steep.r, 6);
    for (let v = 6; v < 36; v++)
      expect([color.getX(v), color.getY(v), color.getZ(v)]).toEqual([
        expect.closeTo(moss.r, 6),
        expect.closeTo(moss.g, 6),
        expect.closeTo(moss.b, 6),
      ]);
    geometry.dispose();
  });

  it('grades the overhang tint from slate at the threshold to rust at a ceiling', () => {
    const mild = new Color(OVERHANG_MILD_HEX).toArray();
    const steep = new Color(OVERHANG_STEEP_HEX).toArray();
    // A face 45° from vertical (normal z = -sin 45°) is at the threshold; 67.5° is halfway.
    expect(overhangRgb(-Math.SQRT1_2, 45, mild, steep)).toEqual(mild.map((c) => expect.closeTo(c, 9)));
    expect(overhangRgb(-1, 45, mild, steep)).toEqual(steep.map((c) => expect.closeTo(c, 9)));
    const half = overhangRgb(-Math.sin((67.5 * Math.PI) / 180), 45, mild, steep);
    half.forEach((c, k) => expect(c).toBeCloseTo((mild[k] + steep[k]) / 2, 9));
  });

  it("the legend's swatch uses the same two colours as the drawing (common practice, no source)", () => {
    // The CSS variables are set from the palette at start-up (applyPaletteVariables).
    const css = new Map<string, string>();
    applyPaletteVariables({ style: { setProperty: (name, value) => css.set(name, value) } });
    const overlay = readFileSync(new URL('../src/components/editor/StageOverlay.vue', import.meta.url), 'utf8');
    expect(css.get('--nw-slate')).toBe(OVERHANG_MILD_HEX);
    expect(css.get('--nw-rust')).toBe(OVERHANG_STEEP_HEX);
    expect(overlay).toMatch(/\.swatch--overhang \{[^}]*linear-gradient\(90deg, var\(--nw-slate\), var\(--nw-rust\)\)/);
  });

  it('writes a smaller mesh into a geometry with room in place: drawn and uploaded only as far as it reaches', () => {
    // The 10 mm cube in room for 30 triangles, then three faces of a 5 mm cube moved to x = 20 (analytic bounds).
    const big = meshToBufferGeometry(cube(), null, {}, 30);
    const position = big.getAttribute('position') as BufferAttribute;
    expect(position.count).toBe(90);
    expect(big.drawRange.count).toBe(36);
    const small = cube();
    for (let i = 0; i < small.positions.length; i += 3) {
      small.positions[i] = small.positions[i] / 2 + 20;
      small.positions[i + 1] /= 2;
      small.positions[i + 2] /= 2;
    }
    const firstArray = position.array;
    // Half the cube's triangles (the bottom, top and front faces): 6 triangles, fewer than before.
    const half = { positions: small.positions, indices: small.indices.slice(0, 18) };
    expect(updateBufferGeometry(big, half)).toBe(true);
    expect(big.getAttribute('position').array).toBe(firstArray);
    expect(big.drawRange.count).toBe(18);
    expect(position.updateRanges).toEqual([{ start: 0, count: 54 }]);
    // Bounds of the drawn triangles only (the old cube's vertices beyond the range do not count).
    expect(big.boundingBox!.min.toArray()).toEqual([20, 0, 0]);
    expect(big.boundingBox!.max.toArray()).toEqual([25, 5, 5]);
    expect(big.boundingSphere!.radius).toBeCloseTo(Math.sqrt(3 * 2.5 * 2.5), 6);
    // A mesh larger than the room is refused and nothing changes.
    const many = { positions: small.positions, indices: new Uint32Array(31 * 3) };
    expect(updateBufferGeometry(big, many)).toBe(false);
    expect(big.drawRange.count).toBe(18);
  });

  it('ignores a mask whose length does not match the triangle count', () => {
    const geometry = meshToBufferGeometry(cube(), new Uint8Array(3).fill(1));
    const color = geometry.getAttribute('color');
    for (let v = 0; v < 36; v++) expect(color.getX(v)).toBeCloseTo(SURFACE_RGB[0], 6);
    geometry.dispose();
  });
});

describe('length display', () => {
  it('converts with 25.4 mm per inch and stores millimetres to 0.01 mm', () => {
    // source: 1 in = 25.4 mm exactly (international inch, 1959)
    expect(toDisplayLength(25.4, 'in')).toBeCloseTo(1, 12);
    expect(toDisplayLength(32, 'mm')).toBe(32);
    expect(fromDisplayLength(1.25, 'in')).toBeCloseTo(31.75, 9);
    expect(fromDisplayLength(1.26, 'in')).toBeCloseTo(32.0, 9); // 32.004 rounds to 32.00
  });
});

describe('lengths in inch mode', () => {
  it('shows inches with two more decimals than the millimetres they stand for', () => {
    // source: 1 in = 25.4 mm exactly (international inch, 1959); 32 mm = 1.2598… in, 0.6 mm = 0.0236… in
    expect(formatLength(32, 'in')).toBe('1.260 in');
    expect(formatLength(0.6, 'in', 0)).toBe('0.02 in');
    expect(INCH_DECIMALS).toBe(3);
  });

  it('writes the millimetre lengths of a help text in inches, and leaves mm² and mm³ alone', () => {
    const help = 'Over about 180 mm the box no longer fits a 250 mm build height; typical 28–32 mm. Area in mm² stays.';
    // One inch rule: two more decimals than the millimetre figure as written (whole mm → hundredths of an inch).
    // source: 1 in = 25.4 mm exactly (international inch, 1959); 180 mm = 7.0866 in, 250 mm = 9.8425 in,
    // 28 mm = 1.1024 in, 32 mm = 1.2598 in, 0.6 mm = 0.02362 in
    expect(lengthsInText(help, 'in')).toBe(
      'Over about 7.09 in the box no longer fits a 9.84 in build height; typical 1.10–1.26 in. Area in mm² stays.',
    );
    expect(lengthsInText('walls of 0.6 mm', 'in')).toBe('walls of 0.024 in');
    expect(lengthsInText(help, 'mm')).toBe(help);
    expect(lengthsInText('chamber radius + 42 mm tall', 'in')).not.toMatch(/\bmm\b/);
  });

  it('writes how the outdoor wall is built, and its cautions, in the chosen unit', () => {
    // source: 1 in = 25.4 mm exactly (international inch, 1959); 1.36 mm = 0.0535… in, 2.64 mm = 0.1039… in,
    // 19 mm = 0.7480… in
    expect(wallBuildText(1.36, 2.64, 'mm')).toBe('1.4 mm solid perimeters, 2.6 mm infill core');
    expect(wallBuildText(1.36, 2.64, 'in')).toBe('0.054 in solid perimeters, 0.104 in infill core');
    expect(lengthsInText('The wall insulates about 40 % as well as a 19 mm pine board.', 'in')).toBe(
      'The wall insulates about 40 % as well as a 0.75 in pine board.',
    );
  });
});
