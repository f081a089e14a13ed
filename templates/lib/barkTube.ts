import { seededRandom } from './seededRandom';
import { Solid } from './Solid';

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
   * A round blind hole up from the bottom, centred on the axis (a floor's cleaning opening, made here instead of cut:
   * a cut costs as much as the whole bark mesh). Its points start at angle 0, like the kernel's cylinders.
   */
  bottomHole?: { radiusMm: number; depthMm: number; segments: number };
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
 * @param options - size, texture depth, seed and resolution
 */
export function barkTubeMesh(options: BarkTubeOptions): { positions: Float32Array; indices: Uint32Array } {
  const { radiusMm: R, heightMm: H, segments: n } = options;
  const random = seededRandom(options.seed);
  const ridges = 9 + Math.floor(random() * 5);
  const phase1 = random() * Math.PI * 2;
  const phase2 = random() * Math.PI * 2;
  const wobble = new Float64Array(ridges);
  for (let r = 0; r < ridges; r++) wobble[r] = 0.6 + random() * 0.8;
  const rows = Math.max(2, Math.ceil(H / options.rowMm));
  const radii = barkRadii(options, rows, ridges, phase1, phase2, wobble);
  const kept = keptVertices(radii, n, rows, R);
  // Vertices are numbered in grid order (kept ones only), then the bottom and top centres.
  const number = new Int32Array(n * (rows + 1)).fill(-1);
  let count = 0;
  for (let g = 0; g < kept.length; g++) if (kept[g]) number[g] = count++;
  const bottom = count;
  const top = count + 1;
  const hole = options.bottomHole;
  const m = hole?.segments ?? 0;
  // With a bottom hole: its ring at z = 0 (from `bottom` on), its ring at the hole's depth, then its ceiling's centre.
  const holeTop = bottom + m;
  const ceiling = bottom + 2 * m;
  const positions = new Float32Array((hole ? count + 2 * m + 2 : count + 2) * 3);
  gridPositions(positions, radii, kept, number, n, rows, H);
  if (hole) {
    for (let j = 0; j < m; j++) {
      const phi = (2 * Math.PI * j) / m;
      const x = hole.radiusMm * Math.cos(phi);
      const y = hole.radiusMm * Math.sin(phi);
      positions.set([x, y, 0], (bottom + j) * 3);
      positions.set([x, y, hole.depthMm], (holeTop + j) * 3);
    }
    positions.set([0, 0, hole.depthMm], ceiling * 3);
    positions.set([0, 0, H], (ceiling + 1) * 3);
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
  let triangles = hole ? 2 * n + 4 * m : 2 * n;
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    triangles += columnStart[i + 1] - columnStart[i] + columnStart[j + 1] - columnStart[j] - 2;
  }
  const indices = new Uint32Array(triangles * 3);
  let at = zipStrips(indices, 0, columnStart, columnRows, number, n);
  const topRow = rows * n;
  const topCentre = hole ? ceiling + 1 : top;
  for (let i = 0; i < n; i++)
    at = putTriangle(indices, at, topCentre, number[topRow + i], number[topRow + ((i + 1) % n)]);
  if (!hole) {
    for (let i = 0; i < n; i++) at = putTriangle(indices, at, bottom, number[(i + 1) % n], number[i]);
  } else {
    // The bottom ring between the bark (n points) and the hole (m points), zipped by angle, facing down.
    for (let i = 0, j = 0; i < n || j < m;) {
      if (j === m || (i < n && (i + 1) * m <= (j + 1) * n)) {
        at = putTriangle(indices, at, bottom + (j % m), number[(i + 1) % n], number[i]);
        i++;
      } else {
        at = putTriangle(indices, at, bottom + j, bottom + ((j + 1) % m), number[i % n]);
        j++;
      }
    }
    // The hole's wall, facing the axis, and its flat ceiling, facing down.
    for (let j = 0; j < m; j++) {
      const k = (j + 1) % m;
      at = putTriangle(indices, at, bottom + j, holeTop + k, bottom + k);
      at = putTriangle(indices, at, bottom + j, holeTop + j, holeTop + k);
      at = putTriangle(indices, at, ceiling, holeTop + k, holeTop + j);
    }
  }
  return { positions, indices };
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
  rows: number,
  ridges: number,
  phase1: number,
  phase2: number,
  wobble: Float64Array,
): Float64Array {
  const { radiusMm: R, heightMm: H, barkDepthMm: depth, segments: n } = options;
  const thetas = new Float64Array(n);
  const ridgeOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const theta = (2 * Math.PI * i) / n;
    thetas[i] = theta;
    ridgeOf[i] = Math.floor(((theta / (2 * Math.PI)) * ridges + 10 * ridges) % ridges);
  }
  const radii = new Float64Array(n * (rows + 1));
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    const drift = 0.9 * Math.sin(z / 30 + phase1) + 0.35 * Math.sin(z / 12 + phase2);
    for (let i = 0; i < n; i++) {
      const wave = Math.sin(ridges * thetas[i] + drift);
      // Sharpen the furrows: flat-topped plates with narrow cracks between them.
      const furrow = Math.max(0, wave) ** 3 * wobble[ridgeOf[i]];
      radii[k * n + i] = R - depth * Math.min(1, furrow);
    }
  }
  return radii;
}

/**
 * Which grid points the mesh keeps. A grid vertex on a bark plate (at the full radius) whose eight neighbours are on
 * plates too lies on a straight vertical line between flat strips of the cylinder, so it adds no shape: it is left
 * out, and the strips on either side are triangulated without it. The surface is exactly the one of the full grid
 * with about a third fewer triangles (every kernel operation on the trunk costs in proportion to its triangles).
 */
function keptVertices(radii: Float64Array, n: number, rows: number, R: number): Uint8Array {
  const kept = new Uint8Array(n * (rows + 1)).fill(1);
  for (let k = 1; k < rows; k++) {
    for (let i = 0; i < n; i++) {
      let plate = true;
      for (let dk = -1; dk <= 1 && plate; dk++)
        for (let di = -1; di <= 1 && plate; di++) plate = radii[(k + dk) * n + ((i + di + n) % n)] === R;
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
  n: number,
  rows: number,
  H: number,
): void {
  const cosines = new Float64Array(n);
  const sines = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const theta = (2 * Math.PI * i) / n;
    cosines[i] = Math.cos(theta);
    sines[i] = Math.sin(theta);
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
