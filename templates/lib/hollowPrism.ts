import type { SimplePolygon, Vec3 } from 'manifold-3d';
import { kernel } from './kernel';
import { inKernel } from './kernelClock';
import { Solid, type Outline } from './Solid';
import { MeshBuilder, signedArea } from './meshBuilder';

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

/** Holes straight through the walls of a {@link hollowPrismY}, each from the outside into the void. */
export interface ThroughHolesY {
  /** Outlines in (x, z) through the wall between the outer prism's start (fromY) and the void's. */
  front?: Outline[];
  /** Outlines in (x, z) through the wall between the void's end (toY) and the outer prism's. */
  back?: Outline[];
  /**
   * Outlines in (x, y) straight down through the floor: from the void's lowest face (a horizontal side of its
   * outline) to the outer prism's lowest face. Both faces must hold them with room to spare.
   */
  floor?: Outline[];
}

/**
 * A closed prism along y (one outline, or a section joined in 2D) with a closed prism-shaped void inside it and holes
 * through its walls, built straight as one mesh (the void's faces wound inward, the holes as tubes between the faces
 * they pierce) instead of boolean differences: the same solid as `Solid.prism(outer).subtract(Solid.prism(void),
 * ...holes)` when the void lies strictly inside the outer prism and every hole strictly inside the faces it pierces,
 * at a fraction of the cost. Drafts use it for the cavity, the entry, the vents and the floor opening.
 * @param outer - the outer prism (outline counter-clockwise in (x, z))
 * @param hollow - the void, strictly inside `outer` (outline counter-clockwise in (x, z))
 * @param through - holes from the outside into the void
 * @throws Error when a floor hole does not lie inside both floor faces
 */
export function hollowPrismY(
  outer: PrismAlongY | SectionPrismAlongY,
  hollow: PrismAlongY,
  through: ThroughHolesY = {},
): Solid {
  const mesh = new MeshBuilder();
  const outerLoops =
    'outline' in outer ? [distinctPoints(outer.outline)] : sectionLoops(outer.outlines, outer.holes ?? []);
  const floor = through.floor ?? [];
  const outerFloor = floor.length > 0 ? lowestSide(outerLoops) : undefined;
  const outerRings = addPrism(
    mesh,
    outerLoops,
    outer,
    false,
    through.front ?? [],
    through.back ?? [],
    floor,
    outerFloor,
  );
  const hollowLoop = distinctPoints(hollow.outline);
  const hollowFloor = floor.length > 0 ? lowestSide([hollowLoop]) : undefined;
  const hollowRings = addPrism(
    mesh,
    [hollowLoop],
    hollow,
    true,
    through.front ?? [],
    through.back ?? [],
    floor,
    hollowFloor,
  );
  // Tubes: every cap ring u × v = −y, so along −y the ring at the larger y comes first; floor rings along +z.
  (through.front ?? []).forEach((loop, k) => mesh.wall(loop, hollowRings.front[k], outerRings.front[k], false));
  (through.back ?? []).forEach((loop, k) => mesh.wall(loop, outerRings.back[k], hollowRings.back[k], false));
  floor.forEach((loop, k) => mesh.wall(loop, outerRings.floor[k], hollowRings.floor[k], false));
  return mesh.solid();
}

/** The lowest horizontal side of the loops: which loop, which side (point k to k + 1), its height and x range. */
function lowestSide(loops: Outline[]): { loop: number; side: number; z: number; fromX: number; toX: number } {
  let best: { loop: number; side: number; z: number; fromX: number; toX: number } | undefined;
  loops.forEach((points, loop) => {
    points.forEach(([x0, z0], side) => {
      const [x1, z1] = points[(side + 1) % points.length];
      if (Math.abs(z1 - z0) > 1e-9 || (best && z0 >= best.z)) return;
      best = { loop, side, z: z0, fromX: Math.min(x0, x1), toX: Math.max(x0, x1) };
    });
  });
  if (!best) throw new Error('hollowPrismY: a floor hole needs a horizontal floor side');
  return best;
}

/**
 * Appends one prism whose section is `loops` (outer loops counter-clockwise, holes clockwise), with hole rings in its
 * end caps and, when `floorSide` is given, in the face of that side: caps and that face triangulated by the kernel's
 * polygon triangulator, a quad per other side. `inward` winds every face for a void.
 * @returns the vertex rings of the holes in the start cap, the end cap and the floor face
 */
function addPrism(
  mesh: MeshBuilder,
  loops: Outline[],
  prism: { fromYMm: number; toYMm: number },
  inward: boolean,
  frontHoles: Outline[],
  backHoles: Outline[],
  floorHoles: Outline[],
  floorSide?: { loop: number; side: number; z: number; fromX: number; toX: number },
): { front: number[][]; back: number[][]; floor: number[][] } {
  const { fromYMm, toYMm } = prism;
  const at =
    (y: number) =>
    (u: number, v: number): Vec3 => [u, y, v];
  const starts = loops.map((loop) => mesh.ring(loop, at(fromYMm)));
  const ends = loops.map((loop) => mesh.ring(loop, at(toYMm)));
  const front = frontHoles.map((loop) => mesh.ring(loop, at(fromYMm)));
  const back = backHoles.map((loop) => mesh.ring(loop, at(toYMm)));
  // Caps in (x, z), whose frame normal is −y: the outer prism's start cap faces −y, its end cap +y; a void's the other way.
  const section = (rings: number[][]) => loops.map((points, k) => ({ points, ids: rings[k] }));
  const holes = (outlines: Outline[], rings: number[][]) => outlines.map((points, k) => ({ points, ids: rings[k] }));
  const outers = (rings: number[][]) => section(rings).filter((l) => signedArea(l.points) > 0);
  const inners = (rings: number[][]) => section(rings).filter((l) => signedArea(l.points) < 0);
  mesh.face(outers(starts), [...inners(starts), ...holes(frontHoles, front)], !inward);
  mesh.face(outers(ends), [...inners(ends), ...holes(backHoles, back)], inward);
  // Sides: from the end ring to the start ring is along −y, the caps' frame normal.
  loops.forEach((loop, k) => {
    const solidInside = signedArea(loop) > 0 !== inward;
    mesh.wall(loop, ends[k], starts[k], solidInside, floorSide?.loop === k ? floorSide.side : -1);
  });
  let floor: number[][] = [];
  if (floorSide) {
    // The floor face in (x, y), frame normal +z: the outer prism's faces down, a void's up.
    const { loop, side, z, fromX, toX } = floorSide;
    const n = loops[loop].length;
    const [a, b] = [side, (side + 1) % n];
    const [left, right] = loops[loop][a][0] < loops[loop][b][0] ? [a, b] : [b, a];
    for (const hole of floorHoles)
      for (const [x, y] of hole)
        if (x <= fromX + 1e-6 || x >= toX - 1e-6 || y <= fromYMm + 1e-6 || y >= toYMm - 1e-6)
          throw new Error('hollowPrismY: a floor hole reaches beyond the floor');
    floor = floorHoles.map((hole) => mesh.ring(hole, (u, v) => [u, v, z]));
    const rim = {
      points: [
        [fromX, fromYMm],
        [toX, fromYMm],
        [toX, toYMm],
        [fromX, toYMm],
      ] as Outline,
      ids: [starts[loop][left], starts[loop][right], ends[loop][right], ends[loop][left]],
    };
    mesh.face([rim], holes(floorHoles, floor), inward);
  }
  return { front, back, floor };
}

/** The last few sections {@link sectionLoops} joined, by their input (a slider on another parameter keeps them). */
const joinedSections = new Map<string, Outline[]>();
const JOINED_SECTIONS_KEPT = 8;

/**
 * The loops (outer ones counter-clockwise, holes clockwise) of the union of `outlines` less `holes`, joined in 2D by
 * the kernel's cross-section booleans: far cheaper than joining the prisms in 3D. The result depends only on the
 * input, so the last few are kept and reused (the caller never changes them).
 */
function sectionLoops(outlines: Outline[], holes: Outline[]): Outline[] {
  const key = JSON.stringify([outlines, holes]);
  const kept = joinedSections.get(key);
  if (kept) return kept;
  const loops = inKernel(() => {
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
  joinedSections.set(key, loops);
  if (joinedSections.size > JOINED_SECTIONS_KEPT) joinedSections.delete(joinedSections.keys().next().value as string);
  return loops;
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
