import type { IndexedMesh } from '../../shared/schemas/mesh';
import { numberByFirstUse } from './partMesh';
import type { Outline } from './Solid';
import { earClip } from './meshBuilder';

/** An upright post with a rectangular footprint, standing on an upward-facing surface of a mesh. */
export interface PostOptions {
  /** The footprint's x range, [min, max]. */
  x: [number, number];
  /** The footprint's y range, [min, max]. */
  y: [number, number];
  /** Height of the post's flat top (above the surface everywhere over the footprint). */
  topZ: number;
  /** Only triangles with every corner above this height are the surface the post stands on. */
  surfaceAboveZ: number;
  /** A hole through the post along y: a counter-clockwise outline in (x, z), clear of the surface and the top. */
  holeXZ?: Outline;
}

interface Crossing {
  id: number;
  /** Position along the footprint's boundary: side k (from corner k to corner k + 1) spans [k, k + 1]. */
  s: number;
  /** Going into the footprint along the edge from its lower to its higher vertex number. */
  entering: boolean;
  /** Triangles that used it (two when the surface is closed round it). */
  uses: number;
}

/**
 * Joins an upright post to a closed mesh without a boolean: the surface triangles under the footprint are clipped to
 * its outside (each in its own plane, so the surface keeps its shape), and the post's four walls rise from the clip
 * line to its top. A crossing of a mesh edge with the footprint's outline is computed once and shared by both
 * triangles of the edge, and the walls use the same vertices, so the result is closed exactly when the input is.
 * The result is the union of the mesh and the post when the post's foot lies inside the solid under the surface and
 * no other part of the mesh reaches into the post. A kernel union on a big mesh costs about as much as the whole mesh;
 * this costs a pass over the triangles and a few dozen new ones.
 * @param mesh - a closed, outward-wound mesh whose surface covers the footprint from above
 * @param post - the footprint, top and optional hole
 * @returns the joined mesh, or null in a degenerate case (a mesh vertex on the footprint's outline, an edge through
 * one of its corners, or a surface that does not cover it), where the caller falls back to a boolean
 */
export function standPost(mesh: IndexedMesh, post: PostOptions): IndexedMesh | null {
  const candidates = trianglesOver(mesh, post);
  const join = new PostJoin(mesh, post);
  const dropped = new Uint8Array(mesh.indices.length / 3);
  for (let k = 0; k < candidates.length; k++) {
    const clipped = join.clip(candidates[k]);
    if (clipped === null) return null;
    if (clipped) dropped[candidates[k]] = 1;
  }
  if (!join.raise()) return null;
  return assemble(mesh, dropped, join.added, join.triangles);
}

/** Upward-facing triangles above `surfaceAboveZ` whose bounding box meets the footprint. */
function trianglesOver({ positions, indices }: IndexedMesh, post: PostOptions): number[] {
  const [x0, x1] = post.x;
  const [y0, y1] = post.y;
  const found: number[] = [];
  const count = indices.length / 3;
  for (let tri = 0; tri < count; tri++) {
    const a = indices[tri * 3] * 3;
    const b = indices[tri * 3 + 1] * 3;
    const c = indices[tri * 3 + 2] * 3;
    if (positions[a] < x0 && positions[b] < x0 && positions[c] < x0) continue;
    if (positions[a] > x1 && positions[b] > x1 && positions[c] > x1) continue;
    if (positions[a + 1] < y0 && positions[b + 1] < y0 && positions[c + 1] < y0) continue;
    if (positions[a + 1] > y1 && positions[b + 1] > y1 && positions[c + 1] > y1) continue;
    const z = post.surfaceAboveZ;
    if (positions[a + 2] <= z || positions[b + 2] <= z || positions[c + 2] <= z) continue;
    const up =
      (positions[b] - positions[a]) * (positions[c + 1] - positions[a + 1]) -
      (positions[c] - positions[a]) * (positions[b + 1] - positions[a + 1]);
    if (up > 0) found.push(tri);
  }
  return found;
}

/**
 * Kept triangles in their order, then the new ones; vertices numbered by first use (as the kernel's part meshes are),
 * so the ones no triangle uses any more are dropped.
 */
function assemble(
  { positions, indices }: IndexedMesh,
  dropped: Uint8Array,
  added: number[],
  newTriangles: number[],
): IndexedMesh {
  const triangleCount = dropped.length;
  let keptCount = 0;
  for (let tri = 0; tri < triangleCount; tri++) if (!dropped[tri]) keptCount++;
  const out = new Uint32Array(keptCount * 3 + newTriangles.length);
  let n = 0;
  for (let tri = 0; tri < triangleCount; tri++)
    if (!dropped[tri]) {
      out[n++] = indices[tri * 3];
      out[n++] = indices[tri * 3 + 1];
      out[n++] = indices[tri * 3 + 2];
    }
  for (let k = 0; k < newTriangles.length; k++) out[n++] = newTriangles[k];
  const xyz = new Float32Array(positions.length + added.length);
  xyz.set(positions);
  xyz.set(added, positions.length);
  return numberByFirstUse({ positions: xyz, indices: out });
}

/** The clipping of the surface under the footprint and the post's faces, vertex by vertex. */
class PostJoin {
  /** New vertices (x, y, z each), numbered after the mesh's own; rounded to float32 as they are made. */
  readonly added: number[] = [];
  /** New triangles (vertex numbers), wound outward. */
  readonly triangles: number[] = [];
  private readonly positions: Float32Array;
  private readonly indices: Uint32Array;
  private readonly vertexCount: number;
  private readonly x0: number;
  private readonly x1: number;
  private readonly y0: number;
  private readonly y1: number;
  /** Vertices on the footprint's outline (crossings and corners) and their positions along it. */
  private readonly boundary = new Map<number, number>();
  private readonly corners = [-1, -1, -1, -1];
  private readonly edges = new Map<number, Crossing[]>();

  constructor(
    mesh: IndexedMesh,
    private readonly post: PostOptions,
  ) {
    this.positions = mesh.positions;
    this.indices = mesh.indices;
    this.vertexCount = mesh.positions.length / 3;
    [this.x0, this.x1] = post.x;
    [this.y0, this.y1] = post.y;
  }

  private vertex(x: number, y: number, z: number): number {
    this.added.push(Math.fround(x), Math.fround(y), Math.fround(z));
    return this.vertexCount + this.added.length / 3 - 1;
  }

  private at(id: number, c: number): number {
    return id < this.vertexCount ? this.positions[id * 3 + c] : this.added[(id - this.vertexCount) * 3 + c];
  }

  private cornerXY(k: number): [number, number] {
    return [k === 0 || k === 3 ? this.x0 : this.x1, k < 2 ? this.y0 : this.y1];
  }

  /** Position along the outline of a point on side k (side k runs from corner k to corner k + 1). */
  private along(x: number, y: number, side: number): number {
    const { x0, x1, y0, y1 } = this;
    if (side === 0) return (x - x0) / (x1 - x0);
    if (side === 1) return 1 + (y - y0) / (y1 - y0);
    if (side === 2) return 2 + (x1 - x) / (x1 - x0);
    return 3 + (y1 - y) / (y1 - y0);
  }

  /** The edge's crossings with the outline, in order from its lower to its higher vertex number; null if degenerate. */
  private crossingsOf(a: number, b: number): Crossing[] | null {
    const lo = a < b ? a : b;
    const hi = a < b ? b : a;
    const key = lo * this.vertexCount + hi;
    const known = this.edges.get(key);
    if (known) return known;
    const { positions, x0, x1, y0, y1 } = this;
    const px = positions[lo * 3];
    const py = positions[lo * 3 + 1];
    const pz = positions[lo * 3 + 2];
    const dx = positions[hi * 3] - px;
    const dy = positions[hi * 3 + 1] - py;
    const dz = positions[hi * 3 + 2] - pz;
    // Clip the segment to the footprint: where it enters and leaves, and through which side. Side k's inequality is
    // gap + t·d ≥ 0 (gap: the start's distance inside that side's line).
    let tIn = 0;
    let tOut = 1;
    let sideIn = -1;
    let sideOut = -1;
    const found: Crossing[] = [];
    for (let side = 0; side < 4; side++) {
      const d = side === 0 ? dy : side === 1 ? -dx : side === 2 ? -dy : dx;
      const gap = side === 0 ? py - y0 : side === 1 ? x1 - px : side === 2 ? y1 - py : px - x0;
      if (d === 0) {
        if (gap < 0) return (this.edges.set(key, found), found);
        continue;
      }
      const t = -gap / d;
      if (d > 0) {
        // Two sides at the same parameter: the edge runs through a corner.
        if (t === tIn && sideIn >= 0) return null;
        if (t > tIn) [tIn, sideIn] = [t, side];
      } else {
        if (t === tOut && sideOut >= 0) return null;
        if (t < tOut) [tOut, sideOut] = [t, side];
      }
    }
    // Touching the footprint in one point is degenerate; a vertex on the outline was ruled out before.
    if (tIn === tOut && sideIn >= 0 && sideOut >= 0) return null;
    if (tIn < tOut)
      for (let k = 0; k < 2; k++) {
        const [t, side] = k === 0 ? [tIn, sideIn] : [tOut, sideOut];
        if (side < 0) continue;
        const x = side === 1 ? x1 : side === 3 ? x0 : px + t * dx;
        const y = side === 0 ? y0 : side === 2 ? y1 : py + t * dy;
        const id = this.vertex(x, y, pz + t * dz);
        const s = this.along(x, y, side);
        this.boundary.set(id, s);
        found.push({ id, s, entering: k === 0, uses: 0 });
      }
    this.edges.set(key, found);
    return found;
  }

  /** Corner k of the footprint on the plane of the triangle it falls in (made once). */
  private corner(k: number, tri: number): number {
    if (this.corners[k] >= 0) return this.corners[k];
    const v = [this.indices[tri * 3], this.indices[tri * 3 + 1], this.indices[tri * 3 + 2]];
    const [x, y, z] = [0, 1, 2].map((c) => v.map((id) => this.positions[id * 3 + c]));
    const nx = (y[1] - y[0]) * (z[2] - z[0]) - (z[1] - z[0]) * (y[2] - y[0]);
    const ny = (z[1] - z[0]) * (x[2] - x[0]) - (x[1] - x[0]) * (z[2] - z[0]);
    const nz = (x[1] - x[0]) * (y[2] - y[0]) - (x[2] - x[0]) * (y[1] - y[0]);
    const [cx, cy] = this.cornerXY(k);
    const id = this.vertex(cx, cy, z[0] - (nx * (cx - x[0]) + ny * (cy - y[0])) / nz);
    this.corners[k] = id;
    this.boundary.set(id, k);
    return id;
  }

  /**
   * Replaces a surface triangle by its part outside the footprint.
   * @returns true when the triangle is replaced (or dropped), false when it does not meet the footprint, null when
   * the case is degenerate
   */
  clip(tri: number): boolean | null {
    const { positions, x0, x1, y0, y1 } = this;
    const v = [this.indices[tri * 3], this.indices[tri * 3 + 1], this.indices[tri * 3 + 2]];
    const inside: boolean[] = [];
    for (const id of v) {
      const x = positions[id * 3];
      const y = positions[id * 3 + 1];
      // A vertex on the outline would need the walls to meet it; that is left to the boolean.
      const onX = (x === x0 || x === x1) && y >= y0 && y <= y1;
      const onY = (y === y0 || y === y1) && x >= x0 && x <= x1;
      if (onX || onY) return null;
      inside.push(x > x0 && x < x1 && y > y0 && y < y1);
    }
    // The triangle's boundary outside the footprint: its outside corners and its crossings, in order.
    const items: { id: number; crossing?: Crossing }[] = [];
    let crossings = 0;
    for (let k = 0; k < 3; k++) {
      const a = v[k];
      const b = v[(k + 1) % 3];
      if (!inside[k]) items.push({ id: a });
      const found = this.crossingsOf(a, b);
      if (!found) return null;
      for (let m = 0; m < found.length; m++) {
        const c = found[a < b ? m : found.length - 1 - m];
        c.uses++;
        crossings++;
        items.push({ id: c.id, crossing: a < b ? c : { ...c, entering: !c.entering } });
      }
    }
    if (crossings === 0) {
      if (inside[0] && inside[1] && inside[2]) return true;
      if (inside[0] || inside[1] || inside[2]) return null;
      // No edge meets the footprint: it lies wholly inside the triangle, or wholly outside it.
      if (!this.holds(v, this.cornerXY(0))) return false;
      this.faceXY(
        v,
        [0, 1, 2, 3].map((k) => this.corner(k, tri)),
      );
      return true;
    }
    // Round the triangle's outside part: along the triangle to where it enters the footprint, then clockwise round
    // the footprint (the triangle's inside on the left) to where the triangle leaves it, and on.
    const used = new Set<number>();
    for (let start = 0; start < items.length; start++) {
      const first = items[start].crossing;
      if (!first || first.entering || used.has(start)) continue;
      const loop: number[] = [];
      let i = start;
      for (let guard = 0; ; guard++) {
        if (guard > items.length) return null;
        used.add(i);
        loop.push(items[i].id);
        let j = (i + 1) % items.length;
        while (!items[j].crossing) {
          loop.push(items[j].id);
          j = (j + 1) % items.length;
        }
        const entry = items[j].crossing!;
        if (!entry.entering) return null;
        loop.push(entry.id);
        // The next crossing clockwise round the outline from the entry.
        let next = -1;
        let gapToNext = Infinity;
        for (let m = 0; m < items.length; m++) {
          const c = items[m].crossing;
          if (!c || m === j) continue;
          const gap = (entry.s - c.s + 4) % 4;
          if (gap === 0) return null;
          if (gap < gapToNext) [gapToNext, next] = [gap, m];
        }
        if (next < 0 || items[next].crossing!.entering) return null;
        for (let k = Math.ceil(entry.s) - 1; entry.s - k < gapToNext; k--) loop.push(this.corner((k + 4) % 4, tri));
        if (next === start) break;
        i = next;
      }
      this.faceXY(loop, []);
    }
    return true;
  }

  /** Whether a point lies strictly inside the (upward, counter-clockwise) triangle v. */
  private holds(v: number[], [px, py]: [number, number]): boolean {
    for (let k = 0; k < 3; k++) {
      const a = v[k] * 3;
      const b = v[(k + 1) % 3] * 3;
      const { positions: p } = this;
      if ((p[b] - p[a]) * (py - p[a + 1]) - (p[b + 1] - p[a + 1]) * (px - p[a]) <= 0) return false;
    }
    return true;
  }

  /** A surface face seen from above (outer loop and an optional hole), wound upward. */
  private faceXY(outer: number[], hole: number[]): void {
    const ids = [...outer, ...hole];
    this.face(
      ids.map((id): [number, number] => [this.at(id, 0), this.at(id, 1)]),
      ids,
      hole.length > 0 ? [outer.length] : [],
    );
  }

  /** Ear-clips a planar face given in a 2D frame whose u × v is the outward normal, and adds its triangles. */
  private face(points: [number, number][], ids: number[], holeStarts: number[]): void {
    this.triangles.push(...earClip(points.flat(), ids, holeStarts, true));
  }

  /**
   * The post's walls, top and hole, on the outline the clipping left.
   * @returns false when the surface did not close round the footprint (degenerate)
   */
  raise(): boolean {
    // Every crossing must be shared by the two triangles of its edge, and every corner must lie on the surface.
    for (const found of this.edges.values()) for (const c of found) if (c.uses !== 2) return false;
    if (this.corners.some((c) => c < 0)) return false;
    const outline = [...this.boundary.entries()].sort((p, q) => p[1] - q[1]);
    for (let k = 1; k < outline.length; k++) if (outline[k][1] === outline[k - 1][1]) return false;
    const { x0, x1, y0, y1, post } = this;
    const tops = [0, 1, 2, 3].map((k) => this.vertex(...this.cornerXY(k), post.topZ));
    const hole = post.holeXZ ?? [];
    const front = hole.map(([hx, hz]) => this.vertex(hx, y0, hz));
    const back = hole.map(([hx, hz]) => this.vertex(hx, y1, hz));
    // Side k runs from corner k to corner k + 1 with the footprint on its left, so (along the side) × up is outward.
    const length = [x1 - x0, y1 - y0, x1 - x0, y1 - y0];
    for (let k = 0; k < 4; k++) {
      const foot = outline.filter(([, s]) => s > k && s < k + 1).map(([id]) => id);
      const ring = k === 0 ? front : k === 2 ? back : [];
      const ids = [this.corners[k], ...foot, this.corners[(k + 1) % 4], tops[(k + 1) % 4], tops[k], ...ring];
      const u = (id: number): number =>
        k === 0
          ? this.at(id, 0) - x0
          : k === 1
            ? this.at(id, 1) - y0
            : k === 2
              ? x1 - this.at(id, 0)
              : y1 - this.at(id, 1);
      const points = ids.map((id): [number, number] => [u(id), this.at(id, 2)]);
      points[foot.length + 3] = [0, post.topZ];
      points[foot.length + 2] = [length[k], post.topZ];
      this.face(points, ids, ring.length > 0 ? [foot.length + 4] : []);
    }
    this.triangles.push(tops[0], tops[1], tops[2], tops[0], tops[2], tops[3]);
    // The hole's wall faces into the hole: for a counter-clockwise outline in (x, z), edge × (+y) points inward.
    for (let i = 0; i < hole.length; i++) {
      const j = (i + 1) % hole.length;
      this.triangles.push(front[i], front[j], back[j], front[i], back[j], back[i]);
    }
    return true;
  }
}
