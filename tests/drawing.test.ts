/**
 * Orthographic drawing: the overall dimensions equal the mesh's bounding box (checked against Debian's admesh, an
 * outside tool), outlines of analytic solids land where geometry says, and a hole through a wall draws as a circle of
 * its diameter.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import jscad from '@jscad/modeling';
import { describe, expect, it } from 'vitest';
import { orthographicDrawing, type OrthographicView } from '../shared/drawing/orthographicDrawing';
import { writeStl } from '../shared/mesh/writeStl';
import { productMesh } from '../server/services/specSheetMesh';
import { box, geomToMesh } from './meshFixtures';

/** Sum of segment lengths. */
function totalLength(segments: Float32Array): number {
  let sum = 0;
  for (let i = 0; i < segments.length; i += 4)
    sum += Math.hypot(segments[i + 2] - segments[i], segments[i + 3] - segments[i + 1]);
  return sum;
}

/** Bounding box as admesh reports it ("Min X = …, Max X = …"). */
function admeshBounds(stl: Uint8Array): { min: number[]; max: number[] } {
  const dir = mkdtempSync(join(tmpdir(), 'drawing-'));
  const file = join(dir, 'part.stl');
  writeFileSync(file, stl);
  const out = execFileSync('admesh', [file], { encoding: 'utf8' });
  const min: number[] = [];
  const max: number[] = [];
  for (const axis of ['X', 'Y', 'Z']) {
    const m = new RegExp(`Min ${axis} =\\s*(-?[\\d.]+), Max ${axis} =\\s*(-?[\\d.]+)`).exec(out);
    if (!m) throw new Error(`admesh printed no ${axis} bounds:\n${out}`);
    min.push(Number(m[1]));
    max.push(Number(m[2]));
  }
  return { min, max };
}

function onOutline(view: OrthographicView, u: number, v: number, tol = 1e-3): boolean {
  return (
    Math.abs(u - view.minMm[0]) < tol ||
    Math.abs(u - view.maxMm[0]) < tol ||
    Math.abs(v - view.minMm[1]) < tol ||
    Math.abs(v - view.maxMm[1]) < tol
  );
}

describe('orthographicDrawing', () => {
  it('draws a 100 × 60 × 40 box as its outline in every view, with the box as overall size', () => {
    // analytic: a cuboid's views are rectangles of its side lengths
    const drawing = orthographicDrawing(geomToMesh(box([0, 0, 0], [100, 60, 40])));
    expect(drawing.overallMm.widthMm).toBeCloseTo(100, 4);
    expect(drawing.overallMm.depthMm).toBeCloseTo(60, 4);
    expect(drawing.overallMm.heightMm).toBeCloseTo(40, 4);
    const expected = { front: [100, 40], side: [60, 40], top: [100, 60] } as const;
    for (const view of [drawing.front, drawing.side, drawing.top]) {
      const [w, h] = expected[view.name];
      expect(view.widthMm).toBeCloseTo(w, 4);
      expect(view.heightMm).toBeCloseTo(h, 4);
      // Every visible line lies on the outline, and together they go all the way round it.
      for (let i = 0; i < view.visible.length; i += 4) {
        expect(onOutline(view, view.visible[i], view.visible[i + 1])).toBe(true);
        expect(onOutline(view, view.visible[i + 2], view.visible[i + 3])).toBe(true);
      }
      expect(totalLength(view.visible)).toBeGreaterThanOrEqual(2 * (w + h) - 1e-3);
    }
  });

  it('draws a round hole through the front wall as a visible circle of its diameter, hidden in the top view', () => {
    const { subtract } = jscad.booleans;
    const { cylinder } = jscad.primitives;
    const { rotateX } = jscad.transforms;
    const radius = 16; // a 32 mm entry hole
    // 120 × 20 × 120 plate with a hole along y through it, centred at x = 60, z = 70
    const hole = rotateX(Math.PI / 2, cylinder({ radius, height: 40, segments: 64, center: [60, 0, 0] }));
    const plate = subtract(box([0, 0, 0], [120, 20, 120]), jscad.transforms.translate([0, 10, 70], hole));
    const drawing = orthographicDrawing(geomToMesh(plate));
    const v = drawing.front.visible;
    let circlePoints = 0;
    for (let i = 0; i < v.length; i += 2) {
      const u = v[i];
      const w = v[i + 1];
      if (onOutline(drawing.front, u, w)) continue;
      circlePoints++;
      // a 64-gon's corners sit on the circle
      expect(Math.hypot(u - 60, w - 70)).toBeCloseTo(radius, 2);
    }
    expect(circlePoints).toBeGreaterThanOrEqual(64);
    // In the top view the hole is inside the plate: its edges are hidden, not visible.
    expect(drawing.top.hidden.length).toBeGreaterThan(0);
    for (let i = 0; i < drawing.top.visible.length; i += 2) {
      expect(onOutline(drawing.top, drawing.top.visible[i], drawing.top.visible[i + 1])).toBe(true);
    }
  });

  it.each(['gable-box', 'a-frame', 'round-pod', 'bark-trunk'])(
    '%s: overall dimensions equal the bounding box admesh reports for the same mesh',
    async (templateId) => {
      const { mesh } = await productMesh(templateId, {});
      const drawing = orthographicDrawing(mesh);
      const { min, max } = admeshBounds(writeStl(mesh));
      // admesh prints six decimals of the float32 STL coordinates
      expect(drawing.overallMm.widthMm).toBeCloseTo(max[0] - min[0], 3);
      expect(drawing.overallMm.depthMm).toBeCloseTo(max[1] - min[1], 3);
      expect(drawing.overallMm.heightMm).toBeCloseTo(max[2] - min[2], 3);
      expect(drawing.front.widthMm).toBeCloseTo(drawing.overallMm.widthMm, 6);
      expect(drawing.side.widthMm).toBeCloseTo(drawing.overallMm.depthMm, 6);
      expect(drawing.top.heightMm).toBeCloseTo(drawing.overallMm.depthMm, 6);
      // Standing upright on z = 0.
      expect(min[2]).toBeCloseTo(0, 3);
      expect(drawing.front.visible.length).toBeGreaterThan(0);
    },
    60_000,
  );
});
