import { seededRandom } from './seededRandom';
import { Solid } from './Solid';

/**
 * Furrows shallower than this are left flat (0.05 mm, a quarter of a common 0.2 mm layer and an eighth of a 0.4 mm
 * nozzle's line: common printing practice, from memory).
 */
const FLAT_MM = 0.05;

/** Size and texture of a bark-covered upright cylinder. */
export interface BarkTubeOptions {
  /** Radius of the smooth cylinder the bark is carved into (the ridges' outer radius). */
  radiusMm: number;
  heightMm: number;
  /** Depth of the furrows; 0 gives a smooth cylinder. */
  barkDepthMm: number;
  /** Pattern seed. */
  seed: number;
  /** Points round the circumference. */
  segments: number;
  /** Vertical spacing of the mesh rows. */
  rowMm: number;
  /**
   * A round hole up from the bottom, centred on the axis (a floor's cleaning opening, made here instead of cut: a
   * cut costs as much as the whole bark mesh). Its points start at angle 0, like the kernel's cylinders. It ends in a
   * flat ceiling at its depth, or opens into the first chamber when that chamber's floor is at its depth.
   */
  bottomHole?: { radiusMm: number; depthMm: number; segments: number };
  /** The back (+y) the bark gives way to where it would stand proud of it. */
  back?: BarkBack;
  /** Hollow chambers inside the tube, lowest first. */
  chambers?: readonly BarkChamber[];
}

/**
 * A back on the +y side: the plane y = `yMm`, or, with `treeRadiusMm`, a vertical tree of that radius whose surface
 * touches y = `yMm` (its axis at y = yMm + treeRadiusMm). It must lie inside the tube's radius, and a tree's tangent
 * points from the axis must lie outside it (true for any tree at least as wide as the tube), so every ray from the
 * axis meets the back at most once within the tube and the surface stays a radial height field.
 */
export interface BarkBack {
  yMm: number;
  treeRadiusMm?: number;
}

/**
 * An upright round chamber with a 45° pointed ceiling (its apex one radius above `ceilingZMm`), centred on the axis.
 * It must lie inside the furrows' depth and the back with wall to spare, and above the bottom hole's depth.
 */
export interface BarkChamber {
  radiusMm: number;
  floorZMm: number;
  ceilingZMm: number;
  segments: number;
}

/**
 * A solid upright cylinder (z from 0 to height) whose side carries a bark pattern: furrows that wander as they run
 * up the trunk. The radial change per millimetre of height stays well under 1, so no face is more than 45° from
 * vertical and the texture prints without support (source: 45° self-supporting rule, Mazlan et al., J. Adv. Ind. Tech. & Appl. (UTHM), 2020).
 * @param options - size, texture depth, seed and resolution
 */
export function barkTube(options: BarkTubeOptions): Solid {
  const { positions, indices } = barkTubeMesh(options);
  return Solid.fromMesh(positions, indices);
}

/**
 * The closed, outward-wound triangle mesh of {@link barkTube}, built in plain typed arrays. Each grid pass is a
 * function of its own and no closure is made per call, so the JIT keeps its optimised code from one bark to the next
 * (a closure made per call is a new call target each time, which threw the optimised code away).
 *
 * The back and the chambers are part of the mesh rather than cut by the kernel: every kernel operation on the bark
 * costs about as much as the whole mesh, and more for the many triangles a cut across the texture creates. Where the
 * bark would stand proud of the back, each grid point moves in along its ray onto the back, so the side stays one
 * radial height field (it cannot fold over itself) and the caps, fans from the axis, follow the same outline. Where a
 * furrow crosses the back's edge, the triangles are cut along the seam ({@link splitAtBack}).
 * @param options - size, texture depth, seed, resolution, back and chambers
 */
export function barkTubeMesh(options: BarkTubeOptions): { positions: Float32Array; indices: Uint32Array } {
  const { radiusMm: R, heightMm: H } = options;
  const random = seededRandom(options.seed);
  const ridges = 9 + Math.floor(random() * 5);
  const phase1 = random() * Math.PI * 2;
  const phase2 = random() * Math.PI * 2;
  const wobble = new Float64Array(ridges);
  for (let r = 0; r < ridges; r++) wobble[r] = 0.6 + random() * 0.8;
  const rows = Math.max(2, Math.ceil(H / options.rowMm));
  const thetas = columnAngles(options.segments, R, options.back);
  const n = thetas.length;
  // Per column the radius of its flat parts: the full radius, or the back's where the back lies inside it.
  const flat = new Float64Array(n);
  for (let i = 0; i < n; i++) flat[i] = options.back ? Math.min(R, backDistance(options.back, thetas[i])) : R;
  // The bark's own radii, then where it stands proud of the back, the back's.
  const bark = barkRadii(options, thetas, rows, ridges, phase1, phase2, wobble);
  const radii = new Float64Array(bark.length);
  for (let g = 0; g < bark.length; g++) radii[g] = Math.min(flat[g % n], bark[g]);
  const kept = keptVertices(radii, flat, n, rows);
  // Vertices are numbered in grid order (kept ones only), then the bottom and top centres.
  const number = new Int32Array(n * (rows + 1)).fill(-1);
  let count = 0;
  for (let g = 0; g < kept.length; g++) if (kept[g]) number[g] = count++;
  const bottom = count;
  const top = count + 1;
  const hole = options.bottomHole;
  const m = hole?.segments ?? 0;
  const chambers = options.chambers ?? [];
  // The hole opens into the first chamber when that chamber's floor is at the hole's depth.
  const holeOpens = hole !== undefined && chambers.length > 0 && chambers[0].floorZMm === hole.depthMm;
  // With a bottom hole: its ring at z = 0 (from `bottom` on), its ring at the hole's depth, then its ceiling's centre
  // (left out when the hole opens into a chamber) and the top centre.
  const holeTop = bottom + m;
  const ceiling = bottom + 2 * m;
  const topCentre = hole ? (holeOpens ? ceiling : ceiling + 1) : top;
  const tubeVertices = topCentre + 1;
  // Each chamber: its floor ring, its ceiling ring, its apex and, unless the hole opens into it, its floor's centre.
  let vertexCount = tubeVertices;
  let chamberTriangles = 0;
  for (let c = 0; c < chambers.length; c++) {
    const s = chambers[c].segments;
    const open = c === 0 && holeOpens;
    vertexCount += open ? 2 * s + 1 : 2 * s + 2;
    chamberTriangles += open ? 3 * s + s + m : 4 * s;
  }
  const positions = new Float32Array(vertexCount * 3);
  gridPositions(positions, radii, kept, number, thetas, rows, H);
  if (hole) {
    for (let j = 0; j < m; j++) {
      const phi = (2 * Math.PI * j) / m;
      const x = hole.radiusMm * Math.cos(phi);
      const y = hole.radiusMm * Math.sin(phi);
      positions.set([x, y, 0], (bottom + j) * 3);
      positions.set([x, y, hole.depthMm], (holeTop + j) * 3);
    }
    if (!holeOpens) positions.set([0, 0, hole.depthMm], ceiling * 3);
    positions.set([0, 0, H], topCentre * 3);
  } else {
    positions.set([0, 0, 0], bottom * 3);
    positions.set([0, 0, H], top * 3);
  }
  // The kept rows of each column, column after column: columnRows[columnStart[i] .. columnStart[i + 1]].
  const columnStart = new Int32Array(n + 1);
  const columnRows = new Int32Array(count);
  for (let i = 0, c = 0; i < n; i++) {
    columnStart[i] = c;
    for (let k = 0; k <= rows; k++) if (kept[k * n + i]) columnRows[c++] = k;
    columnStart[i + 1] = c;
  }
  // Each strip between two columns has (column vertices − 2) triangles on the sides, plus the two end fans.
  let triangles = (hole ? 2 * n + 4 * m - (holeOpens ? m : 0) : 2 * n) + chamberTriangles;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    triangles += columnStart[i + 1] - columnStart[i] + columnStart[j + 1] - columnStart[j] - 2;
  }
  const indices = new Uint32Array(triangles * 3);
  let at = zipStrips(indices, 0, columnStart, columnRows, number, n);
  const topRow = rows * n;
  for (let i = 0; i < n; i++)
    at = putTriangle(indices, at, topCentre, number[topRow + i], number[topRow + ((i + 1) % n)]);
  // The bottom row's vertex numbers, for the bottom ring.
  const bottomRing = new Int32Array(n);
  for (let i = 0; i < n; i++) bottomRing[i] = number[i];
  if (!hole) {
    for (let i = 0; i < n; i++) at = putTriangle(indices, at, bottom, number[(i + 1) % n], number[i]);
  } else {
    // The bottom ring between the bark (n points) and the hole (m points), zipped by angle, facing down.
    at = zipRings(indices, at, bottomRing, thetas, bottom, m, false);
    // The hole's wall, facing the axis, and its flat ceiling, facing down.
    for (let j = 0; j < m; j++) {
      const k = (j + 1) % m;
      at = putTriangle(indices, at, bottom + j, holeTop + k, bottom + k);
      at = putTriangle(indices, at, bottom + j, holeTop + j, holeTop + k);
      if (!holeOpens) at = putTriangle(indices, at, ceiling, holeTop + k, holeTop + j);
    }
  }
  let next = tubeVertices;
  for (let c = 0; c < chambers.length; c++) {
    const open = c === 0 && holeOpens;
    at = chamberShell(positions, indices, at, next, chambers[c], open ? holeTop : -1, m);
    next += open ? 2 * chambers[c].segments + 1 : 2 * chambers[c].segments + 2;
  }
  if (!options.back) return { positions, indices };
  const backAt = new Float64Array(n);
  for (let i = 0; i < n; i++) backAt[i] = backDistance(options.back, thetas[i]);
  return splitAtBack(positions, indices, { bark, backAt, thetas, number, kept, rows, H, count });
}

/**
 * Writes one chamber's vertices from `first` on (floor ring, ceiling ring, apex, then the floor's centre unless the
 * floor is a ring round the bottom hole) and its triangles,
 * facing into the chamber (the solid's outside). With `holeRing` ≥ 0 the floor is a ring round the opening whose
 * `holeSegments` points start there. Returns where the next triangle goes.
 */
function chamberShell(
  positions: Float32Array,
  indices: Uint32Array,
  at: number,
  first: number,
  chamber: BarkChamber,
  holeRing: number,
  holeSegments: number,
): number {
  const { radiusMm: r, floorZMm: floorZ, ceilingZMm: ceilingZ, segments: s } = chamber;
  const floorRing = first;
  const ceilingRing = first + s;
  const apex = first + 2 * s;
  const centre = apex + 1;
  const angles = new Float64Array(s);
  for (let j = 0; j < s; j++) {
    const phi = (2 * Math.PI * j) / s;
    angles[j] = phi;
    const x = r * Math.cos(phi);
    const y = r * Math.sin(phi);
    positions.set([x, y, floorZ], (floorRing + j) * 3);
    positions.set([x, y, ceilingZ], (ceilingRing + j) * 3);
  }
  positions.set([0, 0, ceilingZ + r], apex * 3);
  if (holeRing < 0) positions.set([0, 0, floorZ], centre * 3);
  for (let j = 0; j < s; j++) {
    const k = (j + 1) % s;
    at = putTriangle(indices, at, floorRing + j, ceilingRing + k, floorRing + k);
    at = putTriangle(indices, at, floorRing + j, ceilingRing + j, ceilingRing + k);
    at = putTriangle(indices, at, ceilingRing + j, apex, ceilingRing + k);
    if (holeRing < 0) at = putTriangle(indices, at, centre, floorRing + j, floorRing + k);
  }
  if (holeRing >= 0) {
    const ring = new Int32Array(s);
    for (let j = 0; j < s; j++) ring[j] = floorRing + j;
    at = zipRings(indices, at, ring, angles, holeRing, holeSegments, true);
  }
  return at;
}

/**
 * Zips a flat ring between an outer loop (its vertex numbers and angles, increasing from about 0) and an inner
 * circle of `m` points numbered from `inner` on (starting at angle 0), by angle, facing up or down. Returns where the
 * next triangle goes.
 */
function zipRings(
  indices: Uint32Array,
  at: number,
  outer: Int32Array,
  outerAngles: Float64Array,
  inner: number,
  m: number,
  up: boolean,
): number {
  const n = outer.length;
  const turn = 2 * Math.PI;
  for (let i = 0, j = 0; i < n || j < m;) {
    const outerNext = i + 1 < n ? outerAngles[i + 1] : turn;
    const innerNext = ((j + 1) * turn) / m;
    if (j === m || (i < n && outerNext <= innerNext)) {
      const [b, c] = up ? [outer[i], outer[(i + 1) % n]] : [outer[(i + 1) % n], outer[i]];
      at = putTriangle(indices, at, inner + (j % m), b, c);
      i++;
    } else {
      const [b, c] = up ? [outer[i % n], inner + ((j + 1) % m)] : [inner + ((j + 1) % m), outer[i % n]];
      at = putTriangle(indices, at, inner + j, b, c);
      j++;
    }
  }
  return at;
}

/** Distance from the axis, along the ray at angle `theta`, to the back (infinite where the ray misses it). */
function backDistance(back: BarkBack, theta: number): number {
  const s = Math.sin(theta);
  if (s <= 0) return Infinity;
  if (back.treeRadiusMm === undefined) return back.yMm / s;
  const c = back.yMm + back.treeRadiusMm;
  const cosine = Math.cos(theta);
  const discriminant = back.treeRadiusMm ** 2 - c * c * cosine * cosine;
  return discriminant < 0 ? Infinity : c * s - Math.sqrt(discriminant);
}

/**
 * The columns' angles: `n` evenly spaced, plus a column at each edge of the back (where the back meets the full
 * radius), so the seam between the bark plates and the back lies exactly on a column. An even column closer than a
 * tenth of a step to an edge moves onto it instead (no sliver strips).
 */
function columnAngles(n: number, R: number, back: BarkBack | undefined): Float64Array {
  const step = (2 * Math.PI) / n;
  const angles: number[] = [];
  for (let i = 0; i < n; i++) angles.push(i * step);
  if (!back) return Float64Array.from(angles);
  const Rm = back.treeRadiusMm;
  const c = Rm === undefined ? 0 : back.yMm + Rm;
  // The sine of the angle where the back crosses the circle of radius R.
  const sine = Rm === undefined ? back.yMm / R : (R * R + c * c - Rm * Rm) / (2 * R * c);
  if (!(sine > 0 && sine < 1)) return Float64Array.from(angles);
  const edge = Math.asin(sine);
  for (const theta of [edge, Math.PI - edge]) {
    const nearest = Math.round(theta / step);
    if (Math.abs(theta - nearest * step) < step / 10) angles[nearest % n] = theta;
    else angles.push(theta);
  }
  return Float64Array.from(angles).sort();
}

/** The side's grid, for {@link splitAtBack}. */
interface SideGrid {
  /** The bark's radius at each grid point, before the back. */
  bark: Float64Array;
  /** Distance from the axis to the back along each column's ray (infinite where the ray misses it). */
  backAt: Float64Array;
  thetas: Float64Array;
  /** Each grid point's vertex number (−1 for a point left out). */
  number: Int32Array;
  kept: Uint8Array;
  rows: number;
  H: number;
  /** Vertices below this number are grid points; the others (cap centres, hole rings, chambers) are not. */
  count: number;
}

/**
 * Splits every triangle that a furrow's edge of the back crosses along that seam. A grid point where the bark stands
 * proud of the back has moved onto the back; one where it does not has stayed on the bark. On each edge between
 * the two kinds a new point is put where the bark's height over the back, linear along the edge, is zero (on the
 * bark's own edge), and the triangle is cut there into two or three. So the seam follows the true intersection curve
 * to the grid's precision instead of running straight across a whole strip. Each seam point belongs to its edge
 * (shared by the two triangles on it), so the mesh stays closed, and each piece lies inside the radial projection of
 * its triangle, so the side stays a radial height field.
 */
function splitAtBack(
  positions: Float32Array,
  indices: Uint32Array,
  grid: SideGrid,
): { positions: Float32Array; indices: Uint32Array } {
  const { bark, backAt, thetas, number, kept, rows, H, count } = grid;
  const n = thetas.length;
  // Per grid vertex: its height over the back (> 0: moved onto the back) and its position on the bark.
  const over = new Float64Array(count);
  const onBark = new Float64Array(count * 3);
  for (let g = 0; g < kept.length; g++) {
    if (!kept[g]) continue;
    const v = number[g];
    const i = g % n;
    const height = bark[g] - backAt[i];
    // A point within a micrometre of the back counts as on it: no seam point so close to it that the two would
    // round to one position or make a sliver.
    over[v] = Math.abs(height) < 1e-3 ? 0 : height;
    onBark[v * 3] = bark[g] * Math.cos(thetas[i]);
    onBark[v * 3 + 1] = bark[g] * Math.sin(thetas[i]);
    onBark[v * 3 + 2] = (H * Math.floor(g / n)) / rows;
  }
  const seamPoints = new Map<number, number>();
  const added: number[] = [];
  const vertexCount = positions.length / 3;
  const out = new Uint32Array(indices.length * 3);
  let at = 0;
  const corners = [0, 0, 0];
  const cuts = [-1, -1, -1];
  for (let t = 0; t < indices.length; t += 3) {
    let crossed = 0;
    for (let e = 0; e < 3; e++) {
      const a = indices[t + e];
      const b = indices[t + ((e + 1) % 3)];
      corners[e] = a;
      cuts[e] = -1;
      if (a >= count || b >= count || !((over[a] > 0 && over[b] < 0) || (over[a] < 0 && over[b] > 0))) continue;
      const key = Math.min(a, b) * count + Math.max(a, b);
      let point = seamPoints.get(key);
      if (point === undefined) {
        const s = over[a] / (over[a] - over[b]);
        point = vertexCount + added.length / 3;
        for (let d = 0; d < 3; d++) added.push(onBark[a * 3 + d] + s * (onBark[b * 3 + d] - onBark[a * 3 + d]));
        seamPoints.set(key, point);
      }
      cuts[e] = point;
      crossed++;
    }
    if (crossed === 0) {
      at = putTriangle(out, at, corners[0], corners[1], corners[2]);
      continue;
    }
    // Rotate so that edge 0 (corner 0 to corner 1) is cut, and with two cuts, edge 2 (corner 2 to corner 0) too.
    let r = 0;
    if (crossed === 1) r = cuts[0] >= 0 ? 0 : cuts[1] >= 0 ? 1 : 2;
    else r = cuts[0] >= 0 && cuts[2] >= 0 ? 0 : cuts[0] >= 0 ? 1 : 2;
    const a = corners[r];
    const b = corners[(r + 1) % 3];
    const c = corners[(r + 2) % 3];
    const ab = cuts[r];
    if (crossed === 1) {
      at = putTriangle(out, at, a, ab, c);
      at = putTriangle(out, at, ab, b, c);
    } else {
      const ca = cuts[(r + 2) % 3];
      at = putTriangle(out, at, a, ab, ca);
      at = putTriangle(out, at, ab, b, c);
      at = putTriangle(out, at, ab, c, ca);
    }
  }
  if (added.length === 0) return { positions, indices };
  const grown = new Float32Array(positions.length + added.length);
  grown.set(positions);
  grown.set(added, positions.length);
  return { positions: grown, indices: out.slice(0, at) };
}

/** Writes one triangle at `at` and returns where the next one goes. */
function putTriangle(indices: Uint32Array, at: number, a: number, b: number, c: number): number {
  indices[at] = a;
  indices[at + 1] = b;
  indices[at + 2] = c;
  return at + 3;
}

/**
 * The bark's radius at every grid point (row after row, n points a row): furrows that wander as they run up the
 * trunk. Per column the angle and its ridge, per row the furrows' drift, so the grid takes one sine per point.
 */
function barkRadii(
  options: BarkTubeOptions,
  thetas: Float64Array,
  rows: number,
  ridges: number,
  phase1: number,
  phase2: number,
  wobble: Float64Array,
): Float64Array {
  const { radiusMm: R, heightMm: H, barkDepthMm: depth } = options;
  const n = thetas.length;
  const ridgeOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const theta = thetas[i];
    ridgeOf[i] = Math.floor(((theta / (2 * Math.PI)) * ridges + 10 * ridges) % ridges);
  }
  const radii = new Float64Array(n * (rows + 1));
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    const drift = 0.9 * Math.sin(z / 30 + phase1) + 0.35 * Math.sin(z / 12 + phase2);
    for (let i = 0; i < n; i++) {
      const wave = Math.sin(ridges * thetas[i] + drift);
      // Sharpen the furrows: flat-topped plates with narrow cracks between them.
      const furrow = depth * Math.min(1, Math.max(0, wave) ** 3 * wobble[ridgeOf[i]]);
      // A furrow's shallow edge is plate: a point that stays on the plate can be left out of the mesh (see
      // keptVertices), which saves about a tenth of the triangles, and FLAT_MM is far below what a printer shows.
      radii[k * n + i] = furrow < FLAT_MM ? R : R - furrow;
    }
  }
  return radii;
}

/**
 * Which grid points the mesh keeps. A grid vertex at its column's flat radius (a bark plate at the full radius, or
 * the back) whose eight neighbours are at their columns' flat radii too lies on a straight vertical line between
 * flat vertical strips, so it adds no shape: it is left out, and the strips on either side are triangulated without
 * it. The surface is exactly the one of the full grid with about a third fewer triangles (every kernel operation on
 * the trunk costs in proportion to its triangles).
 */
function keptVertices(radii: Float64Array, flat: Float64Array, n: number, rows: number): Uint8Array {
  const kept = new Uint8Array(n * (rows + 1)).fill(1);
  for (let k = 1; k < rows; k++) {
    for (let i = 0; i < n; i++) {
      let plate = true;
      for (let dk = -1; dk <= 1 && plate; dk++)
        for (let di = -1; di <= 1 && plate; di++) {
          const column = (i + di + n) % n;
          plate = radii[(k + dk) * n + column] === flat[column];
        }
      if (plate) kept[k * n + i] = 0;
    }
  }
  return kept;
}

/** The kept grid points' positions, at their numbers. */
function gridPositions(
  positions: Float32Array,
  radii: Float64Array,
  kept: Uint8Array,
  number: Int32Array,
  thetas: Float64Array,
  rows: number,
  H: number,
): void {
  const n = thetas.length;
  const cosines = new Float64Array(n);
  const sines = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    cosines[i] = Math.cos(thetas[i]);
    sines[i] = Math.sin(thetas[i]);
  }
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    for (let i = 0; i < n; i++) {
      const g = k * n + i;
      if (!kept[g]) continue;
      const at = number[g] * 3;
      positions[at] = radii[g] * cosines[i];
      positions[at + 1] = radii[g] * sines[i];
      positions[at + 2] = z;
    }
  }
}

/**
 * Zips each strip between two columns from the bottom up: it steps up the right column when its next row is not
 * above the left's (on the full grid this gives each quad's two triangles), else up the left one. Returns where the
 * next triangle goes.
 */
function zipStrips(
  indices: Uint32Array,
  at: number,
  columnStart: Int32Array,
  columnRows: Int32Array,
  number: Int32Array,
  n: number,
): number {
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const left = columnStart[i];
    const leftEnd = columnStart[i + 1] - 1;
    const right = columnStart[j];
    const rightEnd = columnStart[j + 1] - 1;
    let l = left;
    let r = right;
    while (l < leftEnd || r < rightEnd) {
      const a = number[columnRows[l] * n + i];
      const b = number[columnRows[r] * n + j];
      if (r < rightEnd && (l === leftEnd || columnRows[r + 1] <= columnRows[l + 1])) {
        r++;
        at = putTriangle(indices, at, a, b, number[columnRows[r] * n + j]);
      } else {
        l++;
        at = putTriangle(indices, at, a, b, number[columnRows[l] * n + i]);
      }
    }
  }
  return at;
}
