import type { SimplePolygon, Vec3 } from 'manifold-3d';
import { kernel } from './kernel';
import { inKernel } from './kernelClock';
import { Solid, type Outline } from './Solid';

/** One prism along y: an outline in the (x, z) plane between two y coordinates. */
export interface PrismAlongY {
  outline: Outline;
  fromYMm: number;
  toYMm: number;
}

/** A prism along y whose section is the union of `outlines` less `holes` (all in the (x, z) plane). */
export interface SectionPrismAlongY {
  outlines: Outline[];
  holes?: Outline[];
  fromYMm: number;
  toYMm: number;
}

/**
 * A closed prism along y (one outline, or a section joined in 2D) with a closed prism-shaped void inside it, built straight as one mesh (the void's faces
 * wound inward) instead of a boolean difference: the same solid as `Solid.prism(outer).subtract(Solid.prism(void))`
 * when the void lies strictly inside the outer prism, at a fraction of the cost. Drafts use it for the cavity.
 * @param outer - the outer prism (outline counter-clockwise in (x, z))
 * @param hollow - the void, strictly inside `outer` (outline counter-clockwise in (x, z))
 */
export function hollowPrismY(outer: PrismAlongY | SectionPrismAlongY, hollow: PrismAlongY): Solid {
  const positions: number[] = [];
  const indices: number[] = [];
  const loops = 'outline' in outer ? [distinctPoints(outer.outline)] : sectionLoops(outer.outlines, outer.holes ?? []);
  addPrism(positions, indices, loops, outer.fromYMm, outer.toYMm, false);
  addPrism(positions, indices, [distinctPoints(hollow.outline)], hollow.fromYMm, hollow.toYMm, true);
  return Solid.fromMesh(new Float32Array(positions), new Uint32Array(indices));
}

/**
 * The loops (outer ones counter-clockwise, holes clockwise) of the union of `outlines` less `holes`, joined in 2D by
 * the kernel's cross-section booleans: far cheaper than joining the prisms in 3D.
 */
function sectionLoops(outlines: Outline[], holes: Outline[]): Outline[] {
  return inKernel(() => {
    const { CrossSection } = kernel();
    const joined = new CrossSection(outlines as SimplePolygon[]);
    const cut = holes.length > 0 ? new CrossSection(holes as SimplePolygon[]) : undefined;
    const section = cut ? joined.subtract(cut) : joined;
    try {
      return section.toPolygons().map((loop) => distinctPoints(loop as Outline));
    } finally {
      for (const object of new Set([joined, cut, section])) object?.delete();
    }
  });
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

/**
 * Appends one prism whose section is `loops` (outer loops counter-clockwise, holes clockwise): caps triangulated by
 * the kernel's polygon triangulator, a quad per side of every loop.
 */
function addPrism(
  positions: number[],
  indices: number[],
  loops: Outline[],
  fromYMm: number,
  toYMm: number,
  inward: boolean,
): void {
  const points = loops.flat();
  const n = points.length;
  const base = positions.length / 3;
  // Ring 0 at fromY, ring 1 at toY. An outline counter-clockwise in (x, z) is clockwise looking along +y, so the cap
  // at fromY (facing −y) keeps the triangulator's order and the cap at toY reverses it.
  for (const y of [fromYMm, toYMm]) for (const [x, z] of points) positions.push(x, y, z);
  const push = (a: number, b: number, c: number): void => {
    if (inward) indices.push(base + a, base + c, base + b);
    else indices.push(base + a, base + b, base + c);
  };
  const caps = inKernel(() => kernel().triangulate(loops as SimplePolygon[], 1e-9)) as Vec3[];
  for (const [a, b, c] of caps) {
    push(a, b, c);
    push(n + a, n + c, n + b);
  }
  let start = 0;
  for (const loop of loops) {
    for (let k = 0; k < loop.length; k++) {
      const i = start + k;
      const j = start + ((k + 1) % loop.length);
      push(i, n + i, n + j);
      push(i, n + j, j);
    }
    start += loop.length;
  }
}
