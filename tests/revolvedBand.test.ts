/**
 * A band of a solid of revolution built in JS and welded to the kernel's revolve of the rest (cut by a boolean), against
 * the kernel's revolve of the whole cross-section less the same cut (source: manifold-3d, Emmett Lalish and
 * contributors, 2024; an outside library used as the reference): closed and 2-manifold, the same volume, bodies and
 * genus.
 */
import { describe, expect, it } from 'vitest';
import { loadKernel } from '../templates/lib/kernel';
import { partMesh } from '../templates/lib/partMesh';
import { joinRevolvedBand } from '../templates/lib/revolvedBand';
import { scoped } from '../templates/lib/scope';
import { Solid, type Outline } from '../templates/lib/Solid';
import { assertClosedManifold } from '../templates/lib/toMesh';
import { manifoldReport } from './templates.meshCheck';

describe('joinRevolvedBand', () => {
  // Cups in (r, z), counter-clockwise: with an opening in the floor (off the axis), and with a closed floor (the band
  // then has two points on the axis). Both are split at z = 30; the seam edge runs from (50, 30) to (40, 30).
  const cups: Record<string, Outline> = {
    'open floor': [
      [20, 0],
      [50, 0],
      [50, 60],
      [40, 60],
      [40, 10],
      [20, 10],
    ],
    'closed floor': [
      [0, 0],
      [50, 0],
      [50, 60],
      [40, 60],
      [40, 10],
      [0, 10],
    ],
  };
  const above: Outline = [
    [50, 30],
    [50, 60],
    [40, 60],
    [40, 30],
  ];
  const below = (cup: Outline): Outline => [cup[0], cup[1], [50, 30], [40, 30], cup[4], cup[5]];

  it.each(Object.keys(cups))('is the kernel revolve less a cut above the seam (%s)', async (name) => {
    await loadKernel();
    const cup = cups[name];
    for (const segments of [16, 24]) {
      const { joined, reference } = scoped(() => {
        const window = Solid.box([30, 10, 10], [35, -5, 40]);
        return {
          joined: joinRevolvedBand(
            partMesh(Solid.revolve(above, segments).subtract(window).translate(0, 0, 7)),
            below(cup),
            2,
            segments,
            7,
          ),
          reference: partMesh(Solid.revolve(cup, segments).subtract(window).translate(0, 0, 7)),
        };
      });
      expect(joined).not.toBeNull();
      assertClosedManifold(joined!);
      const [mine, theirs] = [await manifoldReport(joined!), await manifoldReport(reference)];
      expect(mine.status).toBe('NoError');
      expect(mine.bodies).toBe(theirs.bodies);
      expect(mine.genus).toBe(theirs.genus);
      expect(Math.abs(mine.volumeMm3 - theirs.volumeMm3) / theirs.volumeMm3).toBeLessThan(1e-6);
    }
  });

  it('refuses a rest whose cap a cut has reached', async () => {
    await loadKernel();
    const rest = scoped(() => partMesh(Solid.revolve(above, 24).subtract(Solid.box([30, 10, 20], [35, -5, 25]))));
    expect(joinRevolvedBand(rest, below(cups['open floor']), 2, 24, 0)).toBeNull();
  });
});
