/**
 * Drafts that skip booleans: a hollow prism with holes through its walls, and a floor plug, built straight as one mesh
 * face by face, against the same solids made with manifold-3d's own boolean difference and union (source:
 * manifold-3d, Emmett Lalish and contributors, 2024; an outside library used as the reference). Both must be closed
 * and 2-manifold with the same volume, the same number of bodies and the same genus.
 */
import { describe, expect, it } from 'vitest';
import { loadKernel } from '../templates/lib/kernel';
import { floorPlug } from '../templates/lib/floorPlug';
import { hollowPrismY } from '../templates/lib/hollowPrism';
import { circleOutline } from '../templates/lib/meshBuilder';
import { partMesh } from '../templates/lib/partMesh';
import { scoped } from '../templates/lib/scope';
import { Solid, type Outline } from '../templates/lib/Solid';
import { slotOutline, teardropOutline } from '../templates/lib/teardrop';
import { manifoldReport } from './templates.meshCheck';

const moved = (outline: Outline, du: number, dv: number): Outline => outline.map(([u, v]) => [u + du, v + dv]);

describe('hollowPrismY with holes through its walls', () => {
  it('is the same solid as the prism less the void and the holes', async () => {
    await loadKernel();
    // An A-frame-like section: a pentagon with a crest joined in 2D and a wire tunnel through it.
    const body: Outline = [
      [-75, 0],
      [75, 0],
      [75, 100],
      [0, 230],
      [-75, 100],
    ];
    const crest: Outline = [
      [-8, 200],
      [8, 200],
      [8, 236],
      [0, 250],
      [-8, 236],
    ];
    const tunnel = moved(teardropOutline(5, 8), 0, 232);
    const cavity: Outline = [
      [-65, 10],
      [65, 10],
      [65, 95],
      [0, 208],
      [-65, 95],
    ];
    const entry = moved(teardropOutline(32, 16), 0, 150);
    const slots = [-14, 0, 14].map((x) => moved(slotOutline(6, 30), x, 150));
    const floor = [circleOutline(40, 24), circleOutline(3, 8, [55, 45])];
    const [fromY, toY, voidFrom, voidTo] = [-70, 70, -60, 60];
    const { direct, boolean } = scoped(() => {
      const built = hollowPrismY(
        { outlines: [body, crest], holes: [tunnel], fromYMm: fromY, toYMm: toY },
        { outline: cavity, fromYMm: voidFrom, toYMm: voidTo },
        { front: [entry], back: slots, floor },
      );
      const cuts = [
        Solid.prism(cavity, 'y', voidFrom, voidTo),
        Solid.prism(tunnel, 'y', fromY - 1, toY + 1),
        Solid.prism(entry, 'y', fromY - 1, voidFrom + 1),
        ...slots.map((slot) => Solid.prism(slot, 'y', voidTo - 1, toY + 1)),
        ...floor.map((hole) => Solid.prism(hole, 'z', -1, 11)),
      ];
      const reference = Solid.prism(body, 'y', fromY, toY)
        .add(Solid.prism(crest, 'y', fromY, toY))
        .subtract(...cuts);
      return { direct: partMesh(built), boolean: partMesh(reference) };
    });
    const [mine, theirs] = [await manifoldReport(direct), await manifoldReport(boolean)];
    expect(mine.status).toBe('NoError');
    expect(mine.bodies).toBe(1);
    // Six openings into one cavity (entry, three slots, two floor holes) make five handles; the tunnel one more.
    expect(theirs.genus).toBe(6);
    expect(mine.genus).toBe(theirs.genus);
    expect(Math.abs(mine.volumeMm3 - theirs.volumeMm3) / theirs.volumeMm3).toBeLessThan(1e-5);
  });

  it('refuses a floor hole that reaches beyond the floor', async () => {
    await loadKernel();
    const square: Outline = [
      [-50, 0],
      [50, 0],
      [50, 100],
      [-50, 100],
    ];
    const inner: Outline = [
      [-40, 10],
      [40, 10],
      [40, 90],
      [-40, 90],
    ];
    expect(() =>
      scoped(() =>
        hollowPrismY(
          { outline: square, fromYMm: -50, toYMm: 50 },
          { outline: inner, fromYMm: -40, toYMm: 40 },
          { floor: [circleOutline(45, 16)] },
        ),
      ),
    ).toThrow(/beyond the floor/);
  });
});

describe('floor plug built as one mesh', () => {
  it('is the same solid as the union of flange and boss less the drainage holes', async () => {
    await loadKernel();
    for (const drainageHoles of [0, 4, 6]) {
      const options = {
        openingDiameterMm: 80,
        seatThicknessMm: 10,
        clearanceMm: 0.4,
        drainageHoles,
        segments: 24,
        holeSegments: 8,
      };
      const { direct, boolean } = scoped(() => ({
        direct: partMesh(floorPlug({ ...options, direct: true })),
        boolean: partMesh(floorPlug(options)),
      }));
      const [mine, theirs] = [await manifoldReport(direct), await manifoldReport(boolean)];
      expect(mine.status).toBe('NoError');
      expect(mine.bodies).toBe(1);
      expect(mine.genus).toBe(drainageHoles);
      expect(theirs.genus).toBe(drainageHoles);
      // The boolean plug's boss starts 0.01 mm into the flange, which changes nothing of the union's volume.
      expect(Math.abs(mine.volumeMm3 - theirs.volumeMm3) / theirs.volumeMm3).toBeLessThan(1e-5);
    }
  });
});
