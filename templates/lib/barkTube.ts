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
  const { radiusMm: R, heightMm: H, barkDepthMm: depth, segments: n } = options;
  const random = seededRandom(options.seed);
  const ridges = 9 + Math.floor(random() * 5);
  const phase1 = random() * Math.PI * 2;
  const phase2 = random() * Math.PI * 2;
  const wobble = Array.from({ length: ridges }, () => 0.6 + random() * 0.8);
  const rows = Math.max(2, Math.ceil(H / options.rowMm));
  const radius = (theta: number, z: number): number => {
    const drift = 0.9 * Math.sin(z / 30 + phase1) + 0.35 * Math.sin(z / 12 + phase2);
    const ridge = Math.floor(((theta / (2 * Math.PI)) * ridges + 10 * ridges) % ridges);
    const wave = Math.sin(ridges * theta + drift);
    // Sharpen the furrows: flat-topped plates with narrow cracks between them.
    const furrow = Math.max(0, wave) ** 3 * wobble[ridge];
    return R - depth * Math.min(1, furrow);
  };
  const radii = new Float64Array(n * (rows + 1));
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    for (let i = 0; i < n; i++) radii[k * n + i] = radius((2 * Math.PI * i) / n, z);
  }
  // A grid vertex on a bark plate (at the full radius) whose eight neighbours are on plates too lies on a straight
  // vertical line between flat strips of the cylinder, so it adds no shape: it is left out, and the strips on either
  // side are triangulated without it. The surface is exactly the one of the full grid with about a third fewer
  // triangles (every kernel operation on the trunk costs in proportion to its triangles).
  const kept = new Uint8Array(n * (rows + 1)).fill(1);
  for (let k = 1; k < rows; k++) {
    for (let i = 0; i < n; i++) {
      let plate = true;
      for (let dk = -1; dk <= 1 && plate; dk++)
        for (let di = -1; di <= 1 && plate; di++) plate = radii[(k + dk) * n + ((i + di + n) % n)] === R;
      if (plate) kept[k * n + i] = 0;
    }
  }
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
  for (let k = 0; k <= rows; k++) {
    const z = (H * k) / rows;
    for (let i = 0; i < n; i++) {
      const g = k * n + i;
      if (!kept[g]) continue;
      const theta = (2 * Math.PI * i) / n;
      const at = number[g] * 3;
      positions[at] = radii[g] * Math.cos(theta);
      positions[at + 1] = radii[g] * Math.sin(theta);
      positions[at + 2] = z;
    }
  }
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
  // Each strip between two columns has (column vertices − 2) triangles on the sides, plus the two end fans.
  let triangles = hole ? 2 * n + 4 * m : 2 * n;
  const columnRows: number[][] = [];
  for (let i = 0; i < n; i++) {
    const rowsKept: number[] = [];
    for (let k = 0; k <= rows; k++) if (kept[k * n + i]) rowsKept.push(k);
    columnRows.push(rowsKept);
  }
  for (let i = 0; i < n; i++) triangles += columnRows[i].length + columnRows[(i + 1) % n].length - 2;
  const indices = new Uint32Array(triangles * 3);
  let at = 0;
  const tri = (a: number, b: number, c: number): void => {
    indices[at++] = a;
    indices[at++] = b;
    indices[at++] = c;
  };
  for (let i = 0; i < n; i++) {
    const j = (i + 1) % n;
    const left = columnRows[i];
    const right = columnRows[j];
    // Zip the strip from the bottom up: step up the right column when its next row is not above the left's (on the
    // full grid this gives each quad's two triangles as before), else up the left one.
    let l = 0;
    let r = 0;
    while (l < left.length - 1 || r < right.length - 1) {
      const a = number[left[l] * n + i];
      const b = number[right[r] * n + j];
      if (r < right.length - 1 && (l === left.length - 1 || right[r + 1] <= left[l + 1])) {
        tri(a, b, number[right[++r] * n + j]);
      } else {
        tri(a, b, number[left[++l] * n + i]);
      }
    }
  }
  const topRow = rows * n;
  const topCentre = hole ? ceiling + 1 : top;
  for (let i = 0; i < n; i++) tri(topCentre, number[topRow + i], number[topRow + ((i + 1) % n)]);
  if (!hole) {
    for (let i = 0; i < n; i++) tri(bottom, number[(i + 1) % n], number[i]);
  } else {
    // The bottom ring between the bark (n points) and the hole (m points), zipped by angle, facing down.
    for (let i = 0, j = 0; i < n || j < m;) {
      if (j === m || (i < n && (i + 1) * m <= (j + 1) * n)) {
        tri(bottom + (j % m), number[(i + 1) % n], number[i]);
        i++;
      } else {
        tri(bottom + j, bottom + ((j + 1) % m), number[i % n]);
        j++;
      }
    }
    // The hole's wall, facing the axis, and its flat ceiling, facing down.
    for (let j = 0; j < m; j++) {
      const k = (j + 1) % m;
      tri(bottom + j, holeTop + k, bottom + k);
      tri(bottom + j, holeTop + j, holeTop + k);
      tri(ceiling, holeTop + k, holeTop + j);
    }
  }
  return Solid.fromMesh(positions, indices);
}
