import type { Vec3 } from 'manifold-3d';
import { kernel } from './kernel';
import { inKernel } from './kernelClock';
import { Solid, type Outline } from './Solid';

/** One prism along y: an outline in the (x, z) plane between two y coordinates. */
export interface PrismAlongY {
  outline: Outline;
  fromYMm: number;
  toYMm: number;
}

/**
 * A closed prism along y with a closed prism-shaped void inside it, built straight as one mesh (the void's faces
 * wound inward) instead of a boolean difference: the same solid as `Solid.prism(outer).subtract(Solid.prism(void))`
 * when the void lies strictly inside the outer prism, at a fraction of the cost. Drafts use it for the cavity.
 * @param outer - the outer prism (outline counter-clockwise in (x, z))
 * @param hollow - the void, strictly inside `outer` (outline counter-clockwise in (x, z))
 */
export function hollowPrismY(outer: PrismAlongY, hollow: PrismAlongY): Solid {
  const positions: number[] = [];
  const indices: number[] = [];
  addPrism(positions, indices, outer, false);
  addPrism(positions, indices, hollow, true);
  return Solid.fromMesh(new Float32Array(positions), new Uint32Array(indices));
}

/** Drops consecutive repeated points (and a last point equal to the first). */
function distinctPoints(outline: Outline): Outline {
  const out: Outline = [];
  for (const point of outline) {
    const last = out[out.length - 1];
    if (!last || Math.abs(last[0] - point[0]) > 1e-9 || Math.abs(last[1] - point[1]) > 1e-9) out.push(point);
  }
  const [first, last] = [out[0], out[out.length - 1]];
  if (out.length > 1 && Math.abs(first[0] - last[0]) <= 1e-9 && Math.abs(first[1] - last[1]) <= 1e-9) out.pop();
  return out;
}

/** Appends one prism: caps triangulated by the kernel's polygon triangulator, a quad per side. */
function addPrism(positions: number[], indices: number[], prism: PrismAlongY, inward: boolean): void {
  const outline = distinctPoints(prism.outline);
  const n = outline.length;
  const base = positions.length / 3;
  // Ring 0 at fromY, ring 1 at toY. The outline is counter-clockwise in (x, z); looking along +y that is clockwise,
  // so the cap at fromY (facing −y) keeps the triangulator's order and the cap at toY reverses it.
  for (const y of [prism.fromYMm, prism.toYMm]) for (const [x, z] of outline) positions.push(x, y, z);
  const push = (a: number, b: number, c: number): void => {
    if (inward) indices.push(base + a, base + c, base + b);
    else indices.push(base + a, base + b, base + c);
  };
  const caps = inKernel(() => kernel().triangulate([outline], 1e-9)) as Vec3[];
  for (const [a, b, c] of caps) {
    push(a, b, c);
    push(n + a, n + c, n + b);
  }
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    push(i, n + i, n + j);
    push(i, n + j, j);
  }
}
