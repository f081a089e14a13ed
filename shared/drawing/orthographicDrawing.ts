import type { IndexedMesh } from '../schemas/mesh';
import { meshTopology } from '../analysis/meshTopology';
import { TriangleBvh } from '../analysis/TriangleBvh';

/** The three views of a drawing (third-angle arrangement: top above front, right side to the right of front). */
export type ViewName = 'front' | 'side' | 'top';

/** One orthographic view: line segments in the view plane, millimetres, u to the right and v up. */
export interface OrthographicView {
  name: ViewName;
  /** Mesh axis shown left to right (0 = x, 1 = y, 2 = z). */
  horizontalAxis: 0 | 1 | 2;
  /** Mesh axis shown bottom to top. */
  verticalAxis: 0 | 1 | 2;
  /** Lowest u and v of the projected mesh. */
  minMm: [number, number];
  /** Highest u and v of the projected mesh. */
  maxMm: [number, number];
  /** Extent along u (overall width of the view). */
  widthMm: number;
  /** Extent along v (overall height of the view). */
  heightMm: number;
  /** Visible outline and feature lines: u1, v1, u2, v2 per segment. */
  visible: Float32Array;
  /** Outline and feature lines hidden behind the part (for dashed lines): u1, v1, u2, v2 per segment. */
  hidden: Float32Array;
}

/** A three-view drawing of a part and its overall dimensions. */
export interface OrthographicDrawing {
  front: OrthographicView;
  side: OrthographicView;
  top: OrthographicView;
  /** Overall size along x (width), y (depth) and z (height): the mesh's bounding box. */
  overallMm: { widthMm: number; depthMm: number; heightMm: number };
}

/** Options of {@link orthographicDrawing}. */
export interface OrthographicDrawingOptions {
  /** Edges between faces meeting at more than this angle are drawn as feature lines (default 20°). */
  creaseDeg?: number;
}

interface ViewSpec {
  name: ViewName;
  /** Direction the viewer looks along (unit). */
  look: [number, number, number];
  u: 0 | 1 | 2;
  uSign: 1 | -1;
  v: 0 | 1 | 2;
}

// The part stands upright (+z up) with its front facing −y.
const VIEWS: ViewSpec[] = [
  { name: 'front', look: [0, 1, 0], u: 0, uSign: 1, v: 2 },
  { name: 'side', look: [-1, 0, 0], u: 1, uSign: 1, v: 2 },
  { name: 'top', look: [0, 0, -1], u: 0, uSign: 1, v: 1 },
];

const FACING_EPS = 1e-3;
const SAMPLE_TS = [0.2, 0.5, 0.8];
const RAY_START_MM = 0.01;
const RAY_MIN_MM = 0.02;
const MIN_SEGMENT_MM = 1e-3;

/**
 * Front, side and top orthographic views of a closed mesh standing upright (+z up, front facing −y).
 * Each view draws silhouette edges (where the faces on either side of an edge face the viewer differently) and
 * feature edges (sharper than `creaseDeg`), projected onto the view plane; an edge is hidden when rays from
 * two of three points on it toward the viewer hit the part. Overall dimensions are the extents of the vertices.
 * @param mesh - a welded, closed mesh in millimetres
 * @param options - crease angle
 * @returns the three views and the overall dimensions
 */
export function orthographicDrawing(mesh: IndexedMesh, options: OrthographicDrawingOptions = {}): OrthographicDrawing {
  const creaseCos = Math.cos(((options.creaseDeg ?? 20) * Math.PI) / 180);
  const p = mesh.positions;
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const normals = faceNormals(mesh);
  const { neighbours } = meshTopology(mesh);
  const bvh = new TriangleBvh(mesh);

  const min = [Infinity, Infinity, Infinity];
  const max = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < p.length; i++) {
    const axis = i % 3;
    if (p[i] < min[axis]) min[axis] = p[i];
    if (p[i] > max[axis]) max[axis] = p[i];
  }

  // Candidate edges once: face t, corner k, with the face across (or -1), and whether the edge is a crease.
  const edgeFaces: number[] = [];
  for (let t = 0; t < triangles; t++) {
    for (let k = 0; k < 3; k++) {
      const across = neighbours[t * 3 + k];
      if (across !== -1 && across < t) continue;
      edgeFaces.push(t, k, across);
    }
  }

  const views = VIEWS.map((spec) => {
    const [dx, dy, dz] = spec.look;
    const facing = (face: number): number => {
      const s = normals[face * 3] * dx + normals[face * 3 + 1] * dy + normals[face * 3 + 2] * dz;
      return s < -FACING_EPS ? 1 : s > FACING_EPS ? -1 : 0;
    };
    const visible: number[] = [];
    const hidden: number[] = [];
    for (let e = 0; e < edgeFaces.length; e += 3) {
      const t = edgeFaces[e];
      const k = edgeFaces[e + 1];
      const across = edgeFaces[e + 2];
      let draw = across === -1;
      if (!draw) {
        const crease =
          normals[t * 3] * normals[across * 3] +
            normals[t * 3 + 1] * normals[across * 3 + 1] +
            normals[t * 3 + 2] * normals[across * 3 + 2] <
          creaseCos;
        draw = crease || facing(t) !== facing(across);
      }
      if (!draw) continue;
      const a = idx[t * 3 + k] * 3;
      const b = idx[t * 3 + ((k + 1) % 3)] * 3;
      const u1 = spec.uSign * p[a + spec.u];
      const v1 = p[a + spec.v];
      const u2 = spec.uSign * p[b + spec.u];
      const v2 = p[b + spec.v];
      if (Math.hypot(u2 - u1, v2 - v1) < MIN_SEGMENT_MM) continue;
      let occluded = 0;
      for (const s of SAMPLE_TS) {
        const x = p[a] + (p[b] - p[a]) * s - dx * RAY_START_MM;
        const y = p[a + 1] + (p[b + 1] - p[a + 1]) * s - dy * RAY_START_MM;
        const z = p[a + 2] + (p[b + 2] - p[a + 2]) * s - dz * RAY_START_MM;
        if (bvh.raycast(x, y, z, -dx, -dy, -dz, RAY_MIN_MM)) occluded++;
      }
      (occluded >= 2 ? hidden : visible).push(u1, v1, u2, v2);
    }
    const uMin = spec.uSign === 1 ? min[spec.u] : -max[spec.u];
    const uMax = spec.uSign === 1 ? max[spec.u] : -min[spec.u];
    const view: OrthographicView = {
      name: spec.name,
      horizontalAxis: spec.u,
      verticalAxis: spec.v,
      minMm: [uMin, min[spec.v]],
      maxMm: [uMax, max[spec.v]],
      widthMm: uMax - uMin,
      heightMm: max[spec.v] - min[spec.v],
      visible: Float32Array.from(visible),
      hidden: Float32Array.from(hidden),
    };
    return view;
  });

  return {
    front: views[0],
    side: views[1],
    top: views[2],
    overallMm: { widthMm: max[0] - min[0], depthMm: max[1] - min[1], heightMm: max[2] - min[2] },
  };
}

/** Unit normal of every triangle (zero for a degenerate one). */
function faceNormals(mesh: IndexedMesh): Float64Array {
  const p = mesh.positions;
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const normals = new Float64Array(triangles * 3);
  for (let t = 0; t < triangles; t++) {
    const a = idx[t * 3] * 3;
    const b = idx[t * 3 + 1] * 3;
    const c = idx[t * 3 + 2] * 3;
    const ux = p[b] - p[a],
      uy = p[b + 1] - p[a + 1],
      uz = p[b + 2] - p[a + 2];
    const vx = p[c] - p[a],
      vy = p[c + 1] - p[a + 1],
      vz = p[c + 2] - p[a + 2];
    const nx = uy * vz - uz * vy;
    const ny = uz * vx - ux * vz;
    const nz = ux * vy - uy * vx;
    const length = Math.hypot(nx, ny, nz) || 1;
    normals[t * 3] = nx / length;
    normals[t * 3 + 1] = ny / length;
    normals[t * 3 + 2] = nz / length;
  }
  return normals;
}
