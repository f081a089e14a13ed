/**
 * An upright post joined to a closed mesh without a boolean (the round pod's hanging tab), against the same solid made
 * with manifold-3d's own boolean union (source: manifold-3d, Emmett Lalish and contributors, 2024; an outside library
 * used as the reference). Both must be closed and 2-manifold with the same volume, bodies and genus.
 */
import { describe, expect, it } from 'vitest';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { roundPod } from '../templates/roundPod';
import { BuildContext } from '../templates/lib/BuildContext';
import { loadKernel } from '../templates/lib/kernel';
import { partMesh } from '../templates/lib/partMesh';
import { scoped } from '../templates/lib/scope';
import { Solid, type Outline } from '../templates/lib/Solid';
import { standPost, type PostOptions } from '../templates/lib/standPost';
import { teardropOutline } from '../templates/lib/teardrop';
import { assertClosedManifold } from '../templates/lib/toMesh';
import { manifoldReport } from './templates.meshCheck';

const moved = (outline: Outline, du: number, dv: number): Outline => outline.map(([u, v]) => [u + du, v + dv]);

/** The kernel's union of the mesh and the post (a box from `footZ` to the top, less its hole), as a mesh. */
function unionByKernel(mesh: IndexedMesh, post: PostOptions, footZ: number): IndexedMesh {
  return scoped(() => {
    const [x0, x1] = post.x;
    const [y0, y1] = post.y;
    let box = Solid.box([x1 - x0, y1 - y0, post.topZ - footZ], [x0, y0, footZ]);
    if (post.holeXZ) box = box.subtract(Solid.prism(post.holeXZ, 'y', y0 - 1, y1 + 1));
    return partMesh(Solid.fromMesh(mesh.positions, mesh.indices).add(box));
  });
}

async function expectSameSolid(mine: IndexedMesh, theirs: IndexedMesh): Promise<void> {
  assertClosedManifold(mine);
  const [a, b] = [await manifoldReport(mine), await manifoldReport(theirs)];
  expect(a.status).toBe('NoError');
  expect(b.status).toBe('NoError');
  expect(a.bodies).toBe(b.bodies);
  expect(a.genus).toBe(b.genus);
  expect(Math.abs(a.volumeMm3 - b.volumeMm3) / b.volumeMm3).toBeLessThan(1e-6);
}

describe('standPost', () => {
  it('joins a post across the apex of a seven-sided cone like the kernel union', async () => {
    await loadKernel();
    const cone = scoped(() =>
      partMesh(
        Solid.revolve(
          [
            [0, 0],
            [40, 0],
            [0, 40],
          ],
          7,
        ).rotate(0, 0, 13),
      ),
    );
    const post: PostOptions = {
      x: [-6, 9],
      y: [-3, 5],
      topZ: 60,
      surfaceAboveZ: -1,
      holeXZ: moved(teardropOutline(6, 12), 1, 50),
    };
    const joined = standPost(cone, post);
    expect(joined).not.toBeNull();
    // The hole through the post makes one handle.
    await expectSameSolid(joined!, unionByKernel(cone, post, 5));
    expect((await manifoldReport(joined!)).genus).toBe(1);
  });

  it('joins a post inside one triangle of a flat top (a hole in that triangle) and across its diagonal', async () => {
    await loadKernel();
    const block = scoped(() => partMesh(Solid.box([100, 100, 20], [-50, -50, 0])));
    for (const post of [
      { x: [20, 30], y: [-44, -34], topZ: 35, surfaceAboveZ: 10 },
      { x: [-10, 10], y: [-5, 5], topZ: 35, surfaceAboveZ: 10, holeXZ: moved(teardropOutline(8, 16), 0, 26) },
    ] as PostOptions[]) {
      const joined = standPost(block, post);
      expect(joined).not.toBeNull();
      await expectSameSolid(joined!, unionByKernel(block, post, 10));
    }
  });

  it('leaves a footprint through a mesh vertex to the caller', async () => {
    await loadKernel();
    const block = scoped(() => partMesh(Solid.box([100, 100, 20], [-50, -50, 0])));
    expect(standPost(block, { x: [40, 50], y: [-60, -40], topZ: 35, surfaceAboveZ: 10 })).toBeNull();
    // The corner (30, −30) lies on the top face's diagonal from (50, −50) to (−50, 50).
    expect(standPost(block, { x: [20, 30], y: [-40, -30], topZ: 35, surfaceAboveZ: 10 })).toBeNull();
  });
});

describe('round pod hanging tab', () => {
  it('is the same solid as the kernel union of the pod without its eye and the tab', async () => {
    await loadKernel();
    const sets = [
      {},
      { cleaningAccess: false, perch: true },
      { bodyDiameterMm: 150, bodyHeightMm: 320, wallThicknessMm: 4, floorDiameterMm: 150 },
      { bodyDiameterMm: 240, bodyHeightMm: 200, wallThicknessMm: 20, floorDiameterMm: 80 },
    ];
    for (const quality of ['full', 'draft'] as const)
      for (const set of sets) {
        const build = (hangingHole: boolean): IndexedMesh =>
          scoped(
            () =>
              roundPod.build(roundPod.parameters.parse({ ...set, hangingHole }), new BuildContext(quality)).parts[0]
                .mesh,
          );
        const [withTab, without] = [build(true), build(false)];
        // The tab as the template describes it: 28 × 8 mm, its top 18 mm over the outside cone's apex, an 8 mm
        // teardrop eye 8 mm over the apex, its foot a 45° ridge sunk into the wall (inside it, clear of the cavity).
        let top = -Infinity;
        for (let k = 2; k < withTab.positions.length; k += 3) top = Math.max(top, withTab.positions[k]);
        const apex = top - 18;
        const t = roundPod.parameters.parse(set).wallThicknessMm;
        const d = (4 + t * Math.SQRT2) / 2;
        const reference = scoped(() => {
          const slab = Solid.prism(
            [
              [-14, apex - d - 14],
              [0, apex - d],
              [14, apex - d - 14],
              [14, top],
              [-14, top],
            ],
            'y',
            -4,
            4,
          );
          const eye = Solid.prism(moved(teardropOutline(8, quality === 'full' ? 24 : 12), 0, apex + 8), 'y', -5, 5);
          return partMesh(Solid.fromMesh(without.positions, without.indices).add(slab.subtract(eye)));
        });
        // The template joined the tab itself (no fallback to the kernel): the same bytes as joining it here. The
        // only upward faces under the tab besides the outside cone are the inside floor's, at the wall thickness.
        const eyeOutline = moved(teardropOutline(8, quality === 'full' ? 24 : 12), 0, apex + 8);
        const joined = standPost(without, {
          x: [-14, 14],
          y: [-4, 4],
          topZ: top,
          surfaceAboveZ: t + 1,
          holeXZ: eyeOutline,
        });
        expect(joined).not.toBeNull();
        expect(Buffer.from(joined!.positions.buffer).equals(Buffer.from(withTab.positions.buffer))).toBe(true);
        expect([...joined!.indices]).toEqual([...withTab.indices]);
        await expectSameSolid(withTab, reference);
      }
  });
});
