import type { IndexedMesh } from '../schemas/mesh';

const LEAF_SIZE = 4;

/** A ray hit: distance along the ray and the triangle hit. */
export interface RayHit {
  distanceMm: number;
  triangle: number;
}

/**
 * A bounding volume hierarchy over a mesh's triangles (median split on the longest axis) for rays in any direction.
 * Flat typed arrays only, so it runs the same in a browser worker and in Node.
 */
export class TriangleBvh {
  private readonly positions: Float32Array;
  private readonly indices: Uint32Array;
  private readonly order: Uint32Array;
  /** Per node: minX, minY, minZ, maxX, maxY, maxZ. */
  private readonly bounds: Float32Array;
  /** Per node: left child (or first item for a leaf), right child (or -count for a leaf). */
  private readonly links: Int32Array;
  private nodeCount = 0;
  private readonly stack = new Int32Array(128);

  /** @param mesh - the mesh to index */
  constructor(mesh: IndexedMesh) {
    this.positions = mesh.positions;
    this.indices = mesh.indices;
    const triangles = (mesh.indices.length / 3) | 0;
    this.order = new Uint32Array(triangles);
    for (let i = 0; i < triangles; i++) this.order[i] = i;
    // per-triangle bounds (min x,y,z, max x,y,z) and centroids, so the build never goes back to the index buffer
    const boxes = new Float32Array(triangles * 6);
    const centroids = new Float32Array(triangles * 3);
    const p = mesh.positions;
    const idx = mesh.indices;
    for (let t = 0; t < triangles; t++) {
      const a = idx[t * 3] * 3,
        b = idx[t * 3 + 1] * 3,
        c = idx[t * 3 + 2] * 3;
      for (let d = 0; d < 3; d++) {
        const va = p[a + d],
          vb = p[b + d],
          vc = p[c + d];
        const lo = va < vb ? (va < vc ? va : vc) : vb < vc ? vb : vc;
        const hi = va > vb ? (va > vc ? va : vc) : vb > vc ? vb : vc;
        boxes[t * 6 + d] = lo;
        boxes[t * 6 + 3 + d] = hi;
        centroids[t * 3 + d] = (lo + hi) / 2;
      }
    }
    const maxNodes = Math.max(1, 2 * Math.ceil(triangles / LEAF_SIZE) * 2);
    this.bounds = new Float32Array(maxNodes * 6);
    this.links = new Int32Array(maxNodes * 2);
    if (triangles > 0) this.build(0, triangles, centroids, boxes);
  }

  private build(first: number, end: number, centroids: Float32Array, boxes: Float32Array): number {
    const node = this.nodeCount++;
    let mnx = Infinity,
      mny = Infinity,
      mnz = Infinity,
      mxx = -Infinity,
      mxy = -Infinity,
      mxz = -Infinity;
    let cmnx = Infinity,
      cmny = Infinity,
      cmnz = Infinity,
      cmxx = -Infinity,
      cmxy = -Infinity,
      cmxz = -Infinity;
    for (let i = first; i < end; i++) {
      const t = this.order[i];
      const o = t * 6;
      if (boxes[o] < mnx) mnx = boxes[o];
      if (boxes[o + 1] < mny) mny = boxes[o + 1];
      if (boxes[o + 2] < mnz) mnz = boxes[o + 2];
      if (boxes[o + 3] > mxx) mxx = boxes[o + 3];
      if (boxes[o + 4] > mxy) mxy = boxes[o + 4];
      if (boxes[o + 5] > mxz) mxz = boxes[o + 5];
      const cx = centroids[t * 3],
        cy = centroids[t * 3 + 1],
        cz = centroids[t * 3 + 2];
      if (cx < cmnx) cmnx = cx;
      if (cy < cmny) cmny = cy;
      if (cz < cmnz) cmnz = cz;
      if (cx > cmxx) cmxx = cx;
      if (cy > cmxy) cmxy = cy;
      if (cz > cmxz) cmxz = cz;
    }
    const b = node * 6;
    this.bounds[b] = mnx;
    this.bounds[b + 1] = mny;
    this.bounds[b + 2] = mnz;
    this.bounds[b + 3] = mxx;
    this.bounds[b + 4] = mxy;
    this.bounds[b + 5] = mxz;
    const count = end - first;
    const ex = cmxx - cmnx,
      ey = cmxy - cmny,
      ez = cmxz - cmnz;
    if (count <= LEAF_SIZE || Math.max(ex, ey, ez) === 0) {
      this.links[node * 2] = first;
      this.links[node * 2 + 1] = -count;
      return node;
    }
    const axis = ex >= ey && ex >= ez ? 0 : ey >= ez ? 1 : 2;
    const mid = (first + end) >> 1;
    this.select(first, end, mid, axis, centroids);
    const left = this.build(first, mid, centroids, boxes);
    const right = this.build(mid, end, centroids, boxes);
    this.links[node * 2] = left;
    this.links[node * 2 + 1] = right;
    return node;
  }

  /** Partial sort (quickselect) so order[mid] holds the median centroid on `axis`. */
  private select(first: number, end: number, mid: number, axis: number, centroids: Float32Array): void {
    const order = this.order;
    let lo = first;
    let hi = end - 1;
    while (lo < hi) {
      const pivot = centroids[order[(lo + hi) >> 1] * 3 + axis];
      let i = lo;
      let j = hi;
      while (i <= j) {
        while (centroids[order[i] * 3 + axis] < pivot) i++;
        while (centroids[order[j] * 3 + axis] > pivot) j--;
        if (i <= j) {
          const tmp = order[i];
          order[i] = order[j];
          order[j] = tmp;
          i++;
          j--;
        }
      }
      if (mid <= j) hi = j;
      else if (mid >= i) lo = i;
      else return;
    }
  }

  /**
   * Nearest hit of a ray with the mesh (both sides of each triangle), ignoring hits nearer than `minDistanceMm`.
   * @param ox - origin x
   * @param oy - origin y
   * @param oz - origin z
   * @param dx - unit direction x
   * @param dy - unit direction y
   * @param dz - unit direction z
   * @param minDistanceMm - hits closer than this are skipped (the ray's own face)
   * @param skipTriangle - a triangle to ignore, or -1
   * @returns the nearest hit, or null
   */
  raycast(
    ox: number,
    oy: number,
    oz: number,
    dx: number,
    dy: number,
    dz: number,
    minDistanceMm = 1e-4,
    skipTriangle = -1,
  ): RayHit | null {
    if (this.nodeCount === 0) return null;
    const ix = 1 / dx,
      iy = 1 / dy,
      iz = 1 / dz;
    const stack = this.stack;
    let top = 0;
    stack[top++] = 0;
    let best = Infinity;
    let bestTriangle = -1;
    const p = this.positions;
    const idx = this.indices;
    while (top > 0) {
      const node = stack[--top];
      const b = node * 6;
      let t0 = ((ix >= 0 ? this.bounds[b] : this.bounds[b + 3]) - ox) * ix;
      let t1 = ((ix >= 0 ? this.bounds[b + 3] : this.bounds[b]) - ox) * ix;
      const ty0 = ((iy >= 0 ? this.bounds[b + 1] : this.bounds[b + 4]) - oy) * iy;
      const ty1 = ((iy >= 0 ? this.bounds[b + 4] : this.bounds[b + 1]) - oy) * iy;
      if (ty0 > t0) t0 = ty0;
      if (ty1 < t1) t1 = ty1;
      const tz0 = ((iz >= 0 ? this.bounds[b + 2] : this.bounds[b + 5]) - oz) * iz;
      const tz1 = ((iz >= 0 ? this.bounds[b + 5] : this.bounds[b + 2]) - oz) * iz;
      if (tz0 > t0) t0 = tz0;
      if (tz1 < t1) t1 = tz1;
      // NaN (0 × ∞ on a slab face) fails both comparisons and keeps the node: conservative
      if (t0 > t1 + 1e-6 || t1 < 0 || t0 > best) continue;
      const right = this.links[node * 2 + 1];
      if (right > 0) {
        if (top + 2 > stack.length) continue;
        stack[top++] = this.links[node * 2];
        stack[top++] = right;
        continue;
      }
      const first = this.links[node * 2];
      for (let i = first; i < first - right; i++) {
        const t = this.order[i];
        if (t === skipTriangle) continue;
        const a = idx[t * 3] * 3,
          bb = idx[t * 3 + 1] * 3,
          c = idx[t * 3 + 2] * 3;
        // Möller–Trumbore
        const e1x = p[bb] - p[a],
          e1y = p[bb + 1] - p[a + 1],
          e1z = p[bb + 2] - p[a + 2];
        const e2x = p[c] - p[a],
          e2y = p[c + 1] - p[a + 1],
          e2z = p[c + 2] - p[a + 2];
        const px = dy * e2z - dz * e2y,
          py = dz * e2x - dx * e2z,
          pz = dx * e2y - dy * e2x;
        const det = e1x * px + e1y * py + e1z * pz;
        if (det > -1e-12 && det < 1e-12) continue;
        const inv = 1 / det;
        const sx = ox - p[a],
          sy = oy - p[a + 1],
          sz = oz - p[a + 2];
        const u = (sx * px + sy * py + sz * pz) * inv;
        if (u < 0 || u > 1) continue;
        const qx = sy * e1z - sz * e1y,
          qy = sz * e1x - sx * e1z,
          qz = sx * e1y - sy * e1x;
        const v = (dx * qx + dy * qy + dz * qz) * inv;
        if (v < 0 || u + v > 1) continue;
        const dist = (e2x * qx + e2y * qy + e2z * qz) * inv;
        if (dist >= minDistanceMm && dist < best) {
          best = dist;
          bestTriangle = t;
        }
      }
    }
    return bestTriangle < 0 ? null : { distanceMm: best, triangle: bestTriangle };
  }
}
