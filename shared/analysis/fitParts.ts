import type { IndexedMesh } from '../schemas/mesh';
import { buildPlateFit, type PlateFit } from './buildPlateFit';
import { componentOfVertex } from './meshTopology';

/** How the separate parts of one design (e.g. box body and floor plug) fit a printer. */
export interface PartsFit {
  /** Every part fits the build volume on its own (parts may go on separate plates). */
  fits: boolean;
  /** Fit and copies per plate of each part printed on its own, in part order. */
  parts: PlateFit[];
  /** Size [x, y, z] of each part in build orientation, in part order. */
  partSizesMm: Array<[number, number, number]>;
  /** Complete sets (one of every part) packed on one plate; 0 when a set needs more than one plate. */
  setsPerPlate: number;
  /**
   * Copies per plate for production: complete sets per plate when a set fits one plate, otherwise the copies of the
   * part that fits fewest (each part printed on plates of its own); 0 when a part does not fit at all.
   */
  copiesPerPlate: number;
  /** Tallest part: the build height that limits the printer. */
  heightMm: number;
  /** How the parts of one unit go on plates (the one plate rule; see {@link unitPlatePlan}). */
  plan: UnitPlatePlan;
}

/** Plates that carry the same parts: which parts of a unit, and how many units' worth of them one plate holds. */
export interface PlateGroup {
  /** Indexes of the parts on these plates, in part order. */
  partIndexes: number[];
  /** Units' worth of these parts on one plate (at least 1 when the parts fit). */
  unitsPerPlate: number;
}

/**
 * The plate rule for the parts of one unit: all parts on the same plate when a complete set fits (`together`,
 * one plate group, as many sets as fit), otherwise each part on plates of its own (`separate`, one group per part,
 * as many copies of that part as fit), or `none` when a part does not fit the printer at all.
 */
export interface UnitPlatePlan {
  layout: 'together' | 'separate' | 'none';
  groups: PlateGroup[];
  /** Plates one unit needs when printed alone: 1 together, one per part when separate, 0 when it does not fit. */
  platesPerUnit: number;
}

/**
 * The plate rule from a fit: together when a complete set fits one plate, otherwise one plate group per part.
 * @param setsPerPlate - complete sets per plate (0 when a set needs more than one plate)
 * @param parts - each part's own fit, in part order
 */
export function unitPlatePlan(setsPerPlate: number, parts: readonly PlateFit[]): UnitPlatePlan {
  if (parts.length === 0 || parts.some((fit) => !fit.fits)) return { layout: 'none', groups: [], platesPerUnit: 0 };
  if (setsPerPlate > 0) {
    return {
      layout: 'together',
      groups: [{ partIndexes: parts.map((_, i) => i), unitsPerPlate: setsPerPlate }],
      platesPerUnit: 1,
    };
  }
  return {
    layout: 'separate',
    groups: parts.map((fit, i) => ({ partIndexes: [i], unitsPerPlate: fit.copiesPerPlate })),
    platesPerUnit: parts.length,
  };
}

/**
 * Build plates needed for a number of units under the plate rule: for each plate group, the units divided by the
 * units one of its plates holds, rounded up, summed over the groups.
 * @param plan - the plate rule of the design on the printer
 * @param units - complete units wanted
 */
export function platesForUnits(plan: UnitPlatePlan, units: number): number {
  return plan.groups.reduce((sum, group) => sum + Math.ceil(units / group.unitsPerPlate - 1e-9), 0);
}

/**
 * The plate rule in words for a figure or a warning: `3 per plate (every part together)` or
 * `2 plates per unit: body 1 per plate, floor plug 6 per plate`.
 * @param plan - the plate rule
 * @param partNames - part names in part order (`floor-plug` reads "floor plug")
 */
export function describePlatePlan(plan: UnitPlatePlan, partNames: readonly string[] = []): string {
  if (plan.layout === 'none') return 'does not fit this printer';
  if (plan.layout === 'together') {
    const n = plan.groups[0].unitsPerPlate;
    return plan.groups[0].partIndexes.length > 1 ? `${n} per plate (all parts together)` : `${n} per plate`;
  }
  const name = (i: number): string => (partNames[i] ?? `part ${i + 1}`).replace(/[-_]/g, ' ');
  return (
    `${plan.platesPerUnit} plates per unit: ` +
    plan.groups.map((g) => `${name(g.partIndexes[0])} ${g.unitsPerPlate} per plate`).join(', ')
  );
}

/**
 * Bounding-box size of each part of a mesh whose parts follow one another (as `generate()` lays them out).
 * @param mesh - the mesh in build orientation, mm
 * @param partTriangles - triangle count of each part, in mesh order (they sum to the mesh's triangles)
 * @returns one [x, y, z] size per part
 */
export function partSizesMm(mesh: IndexedMesh, partTriangles: readonly number[]): Array<[number, number, number]> {
  const sizes: Array<[number, number, number]> = [];
  let first = 0;
  for (const count of partTriangles) {
    const min = [Infinity, Infinity, Infinity];
    const max = [-Infinity, -Infinity, -Infinity];
    for (let i = first * 3; i < (first + count) * 3; i++) {
      const v = mesh.indices[i] * 3;
      for (let axis = 0; axis < 3; axis++) {
        const value = mesh.positions[v + axis];
        if (value < min[axis]) min[axis] = value;
        if (value > max[axis]) max[axis] = value;
      }
    }
    sizes.push(count > 0 ? [max[0] - min[0], max[1] - min[1], max[2] - min[2]] : [0, 0, 0]);
    first += count;
  }
  return sizes;
}

/**
 * Volume of each part of a mesh whose parts follow one another (divergence theorem over each part's triangles).
 * @param mesh - the mesh, mm
 * @param partTriangles - triangle count of each part, in mesh order
 * @returns one volume per part, mm³
 */
export function partVolumesMm3(mesh: IndexedMesh, partTriangles: readonly number[]): number[] {
  const p = mesh.positions;
  const volumes: number[] = [];
  let first = 0;
  for (const count of partTriangles) {
    let sixfold = 0;
    for (let t = first; t < first + count; t++) {
      const a = mesh.indices[t * 3] * 3;
      const b = mesh.indices[t * 3 + 1] * 3;
      const c = mesh.indices[t * 3 + 2] * 3;
      sixfold +=
        p[a] * (p[b + 1] * p[c + 2] - p[b + 2] * p[c + 1]) -
        p[a + 1] * (p[b] * p[c + 2] - p[b + 2] * p[c]) +
        p[a + 2] * (p[b] * p[c + 1] - p[b + 1] * p[c]);
    }
    volumes.push(Math.abs(sixfold) / 6);
    first += count;
  }
  return volumes;
}

/**
 * Bounding-box size of each separate part of a mesh whose part boundaries are not known (an uploaded STL or 3MF):
 * the connected parts, less any part whose box lies inside another's (the inner surface of a hollow part is a
 * shell of its own but takes no plate space).
 * @param mesh - the mesh in build orientation, mm
 * @returns one [x, y, z] size per part
 */
export function componentSizesMm(mesh: IndexedMesh): Array<[number, number, number]> {
  const { part, count } = componentOfVertex(mesh);
  const boxes = Array.from({ length: count }, () => [Infinity, Infinity, Infinity, -Infinity, -Infinity, -Infinity]);
  const p = mesh.positions;
  for (let v = 0; v < part.length; v++) {
    if (part[v] < 0) continue;
    const box = boxes[part[v]];
    for (let axis = 0; axis < 3; axis++) {
      const value = p[v * 3 + axis];
      if (value < box[axis]) box[axis] = value;
      if (value > box[axis + 3]) box[axis + 3] = value;
    }
  }
  const inside = (a: number[], b: number[]) =>
    a !== b && [0, 1, 2].every((axis) => a[axis] >= b[axis] && a[axis + 3] <= b[axis + 3]);
  return boxes
    .filter((box) => !boxes.some((other) => inside(box, other)))
    .map((box): [number, number, number] => [box[3] - box[0], box[4] - box[1], box[5] - box[2]]);
}

/**
 * Whether a design's parts fit a printer and how many complete sets go on one plate. Each part must fit the build
 * volume on its own (allowing a 90° turn about z); sets are packed on the plate as footprint rectangles in shelves
 * (rows), every part turned the same way, with a gap between parts. For a single part this equals
 * {@link buildPlateFit}'s grid count n = floor((B + s) / (f + s)) per axis.
 * @param sizesMm - each part's [x, y, z] size in build orientation
 * @param buildVolumeMm - printer build volume [x, y, z]
 * @param spacingMm - gap between parts (10 mm: common practice, no source)
 */
export function fitPartSizes(
  sizesMm: ReadonlyArray<readonly number[]>,
  buildVolumeMm: readonly number[],
  spacingMm = 10,
): PartsFit {
  const parts = sizesMm.map((size) => buildPlateFit(size, buildVolumeMm, spacingMm));
  const fits = parts.length > 0 && parts.every((fit) => fit.fits);
  const heightMm = Math.max(0, ...sizesMm.map((size) => size[2]));
  const sizes = sizesMm.map((size): [number, number, number] => [size[0], size[1], size[2]]);
  if (!fits) {
    const plan = unitPlatePlan(0, parts);
    return { fits, parts, partSizesMm: sizes, setsPerPlate: 0, copiesPerPlate: 0, heightMm, plan };
  }
  const setsPerPlate = maxSetsPerPlate(sizesMm, buildVolumeMm, spacingMm);
  const copiesPerPlate = setsPerPlate > 0 ? setsPerPlate : Math.min(...parts.map((fit) => fit.copiesPerPlate));
  return {
    fits,
    parts,
    partSizesMm: sizes,
    setsPerPlate,
    copiesPerPlate,
    heightMm,
    plan: unitPlatePlan(setsPerPlate, parts),
  };
}

/**
 * {@link fitPartSizes} on a mesh whose parts follow one another, e.g. a `generate()` result's mesh and
 * `partTriangles`.
 * @param mesh - the mesh in build orientation, mm
 * @param partTriangles - triangle count of each part, in mesh order
 * @param buildVolumeMm - printer build volume [x, y, z]
 * @param spacingMm - gap between parts (10 mm: common practice, no source)
 */
export function fitParts(
  mesh: IndexedMesh,
  partTriangles: readonly number[],
  buildVolumeMm: readonly number[],
  spacingMm = 10,
): PartsFit {
  return fitPartSizes(partSizesMm(mesh, partTriangles), buildVolumeMm, spacingMm);
}

/** Largest k such that k copies of every part shelf-pack on the plate, trying four ways to turn the parts. */
function maxSetsPerPlate(
  sizesMm: ReadonlyArray<readonly number[]>,
  buildVolumeMm: readonly number[],
  s: number,
): number {
  const [bx, by] = buildVolumeMm;
  const cells = sizesMm.map((size) => [size[0] + s, size[1] + s] as const);
  const setArea = cells.reduce((sum, [w, d]) => sum + w * d, 0);
  const upper = Math.floor(((bx + s) * (by + s)) / setArea);
  const turns: Array<(w: number, d: number) => [number, number]> = [
    (w, d) => [w, d],
    (w, d) => [d, w],
    (w, d) => [Math.max(w, d), Math.min(w, d)],
    (w, d) => [Math.min(w, d), Math.max(w, d)],
  ];
  for (let k = upper; k > 0; k--) {
    for (const turn of turns) {
      const rects: Array<[number, number]> = [];
      for (const [w, d] of cells) for (let i = 0; i < k; i++) rects.push(turn(w, d));
      if (shelfPacks(rects, bx + s, by + s)) return k;
    }
  }
  return 0;
}

/** Next-fit shelf packing, deepest first: true when every rectangle (already including its gap) fits the plate. */
function shelfPacks(rects: Array<[number, number]>, plateX: number, plateY: number): boolean {
  const sorted = [...rects].sort((a, b) => b[1] - a[1] || b[0] - a[0]);
  let shelfY = 0;
  let shelfDepth = 0;
  let x = 0;
  const eps = 1e-9;
  for (const [w, d] of sorted) {
    if (w > plateX + eps || d > plateY + eps) return false;
    if (x + w > plateX + eps) {
      shelfY += shelfDepth;
      x = 0;
      shelfDepth = 0;
    }
    if (shelfY + d > plateY + eps) return false;
    x += w;
    shelfDepth = Math.max(shelfDepth, d);
  }
  return true;
}
