import type { IndexedMesh } from '../schemas/mesh';
import { heightInTriangle } from './heightInTriangle';

/**
 * Up-facing triangles binned into an x-y grid, so a ray cast straight down tests only the few triangles whose
 * footprint covers its column. Down-facing and vertical faces are left out: a ray going down from outside the part
 * can only meet the part again through a face that points up.
 */
export class PlateGrid {
  /** Bin edge length. */
  readonly binMm: number;
  private readonly originX: number;
  private readonly originY: number;
  private readonly cols: number;
  private readonly rows: number;
  private readonly start: Uint32Array;
  private readonly items: Uint32Array;
  private readonly positions: Float32Array;
  private readonly indices: Uint32Array;

  /**
   * @param mesh - the part in build orientation
   * @param minMm - lower corner of the part's bounds
   * @param maxMm - upper corner of the part's bounds
   */
  constructor(mesh: IndexedMesh, minMm: readonly number[], maxMm: readonly number[]) {
    const p = mesh.positions;
    const idx = mesh.indices;
    this.positions = p;
    this.indices = idx;
    const triangles = (idx.length / 3) | 0;
    const up: number[] = [];
    for (let t = 0; t < triangles; t++) {
      const a = idx[t * 3] * 3;
      const b = idx[t * 3 + 1] * 3;
      const c = idx[t * 3 + 2] * 3;
      const nz = (p[b] - p[a]) * (p[c + 1] - p[a + 1]) - (p[b + 1] - p[a + 1]) * (p[c] - p[a]);
      if (nz > 0) up.push(t);
    }
    const width = Math.max(maxMm[0] - minMm[0], 1e-6);
    const depth = Math.max(maxMm[1] - minMm[1], 1e-6);
    // about one up-facing triangle per bin, at most 512 × 512 bins
    const target = Math.max(1, Math.min(up.length, 512 * 512));
    this.binMm = Math.max(Math.sqrt((width * depth) / target), Math.max(width, depth) / 512);
    this.originX = minMm[0];
    this.originY = minMm[1];
    this.cols = Math.max(1, Math.ceil(width / this.binMm));
    this.rows = Math.max(1, Math.ceil(depth / this.binMm));
    const counts = new Uint32Array(this.cols * this.rows + 1);
    const ranges = new Int32Array(up.length * 4);
    for (let i = 0; i < up.length; i++) {
      const t = up[i];
      const a = idx[t * 3] * 3;
      const b = idx[t * 3 + 1] * 3;
      const c = idx[t * 3 + 2] * 3;
      const c0 = this.col(Math.min(p[a], p[b], p[c]));
      const c1 = this.col(Math.max(p[a], p[b], p[c]));
      const r0 = this.row(Math.min(p[a + 1], p[b + 1], p[c + 1]));
      const r1 = this.row(Math.max(p[a + 1], p[b + 1], p[c + 1]));
      ranges.set([c0, c1, r0, r1], i * 4);
      for (let r = r0; r <= r1; r++) for (let q = c0; q <= c1; q++) counts[r * this.cols + q + 1]++;
    }
    for (let i = 1; i < counts.length; i++) counts[i] += counts[i - 1];
    this.start = counts;
    this.items = new Uint32Array(counts[counts.length - 1]);
    const fill = counts.slice(0, -1);
    for (let i = 0; i < up.length; i++) {
      const [c0, c1, r0, r1] = ranges.subarray(i * 4, i * 4 + 4);
      for (let r = r0; r <= r1; r++) for (let q = c0; q <= c1; q++) this.items[fill[r * this.cols + q]++] = up[i];
    }
  }

  private col(x: number): number {
    return Math.min(this.cols - 1, Math.max(0, Math.floor((x - this.originX) / this.binMm)));
  }

  private row(y: number): number {
    return Math.min(this.rows - 1, Math.max(0, Math.floor((y - this.originY) / this.binMm)));
  }

  /**
   * Casts a ray straight down from (x, y, zFromMm) and returns the height of the first up-facing surface below it.
   * @param x - column x, mm
   * @param y - column y, mm
   * @param zFromMm - start height, mm; surfaces within `gapMm` below it are ignored
   * @param floorMm - returned when nothing is hit (the build plate)
   * @param gapMm - ignore hits closer than this (the ray's own face and its neighbours)
   * @returns the hit height, or `floorMm`
   */
  castDown(x: number, y: number, zFromMm: number, floorMm: number, gapMm = 1e-3): number {
    const q = Math.floor((x - this.originX) / this.binMm);
    const r = Math.floor((y - this.originY) / this.binMm);
    if (q < 0 || r < 0 || q >= this.cols || r >= this.rows) return floorMm;
    const p = this.positions;
    const idx = this.indices;
    const cell = r * this.cols + q;
    const limit = zFromMm - gapMm;
    let best = floorMm;
    for (let i = this.start[cell]; i < this.start[cell + 1]; i++) {
      const t = this.items[i];
      const a = idx[t * 3] * 3;
      const b = idx[t * 3 + 1] * 3;
      const c = idx[t * 3 + 2] * 3;
      const ax = p[a];
      const ay = p[a + 1];
      // barycentric weights of (x, y) in the projected triangle (counter-clockwise seen from above)
      const area = (p[b] - ax) * (p[c + 1] - ay) - (p[b + 1] - ay) * (p[c] - ax);
      const z = heightInTriangle(p, a, b, c, area, x, y); // NaN outside: fails both comparisons
      if (z <= limit && z > best) best = z;
    }
    return best;
  }
}
