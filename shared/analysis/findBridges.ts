import type { IndexedMesh } from '../schemas/mesh';
import type { Bridge } from '../schemas/analysis';
import { FACE_VECTOR_LENGTH, faceVectors } from './faceVectors';
import { PLATE_TOLERANCE_MM } from './measureMesh';

/** Options of the bridge search. */
export interface BridgeOptions {
  /** Faces within this angle of facing straight down count as flat (common practice, no source). */
  flatWithinDeg?: number;
  /** Span above which a bridge is flagged. From memory: a ~10 mm default; no published limit found. */
  warnSpanMm?: number;
  /** Span above which a bridge is judged to fail. From memory: ~20 mm; no published limit found. */
  failSpanMm?: number;
}

/**
 * Finds bridges: connected regions of flat downward faces (not on the plate) whose two opposite sides (along x or
 * along y in build orientation) both meet walls that go down, so the extruded lines are held at both ends.
 * A region held on one side only (a cantilever) is an overhang for the support estimate, not a bridge.
 * The span is the region's bounding-box extent between the holding sides (the shorter one when held both ways).
 * @param mesh - the part in build orientation
 * @param neighbours - face across each edge (from meshTopology)
 * @param plateZMm - height of the build plate
 * @param options - thresholds
 * @returns the bridges, widest first
 */
export function findBridges(
  mesh: IndexedMesh,
  neighbours: Int32Array,
  plateZMm: number,
  options: BridgeOptions = {},
): Bridge[] {
  const warn = options.warnSpanMm ?? 10;
  const fail = options.failSpanMm ?? 20;
  const cosFlat = Math.cos(((options.flatWithinDeg ?? 5) * Math.PI) / 180);
  const p = mesh.positions;
  const idx = mesh.indices;
  const triangles = (idx.length / 3) | 0;
  const flat = new Uint8Array(triangles);
  const area = new Float64Array(triangles);
  const minZ = new Float64Array(triangles);
  const face = new Float64Array(FACE_VECTOR_LENGTH);
  for (let t = 0; t < triangles; t++) {
    const a = idx[t * 3] * 3,
      b = idx[t * 3 + 1] * 3,
      c = idx[t * 3 + 2] * 3;
    const len = faceVectors(p, idx, t, face);
    const nz = face[8];
    area[t] = len / 2;
    minZ[t] = Math.min(p[a + 2], p[b + 2], p[c + 2]);
    const onPlate = Math.max(p[a + 2], p[b + 2], p[c + 2]) <= plateZMm + PLATE_TOLERANCE_MM;
    if (len > 0 && -nz >= cosFlat * len && !onPlate) flat[t] = 1;
  }
  const region = new Int32Array(triangles).fill(-1);
  const bridges: Bridge[] = [];
  const stack: number[] = [];
  for (let seed = 0; seed < triangles; seed++) {
    if (!flat[seed] || region[seed] >= 0) continue;
    const faces: number[] = [];
    region[seed] = seed;
    stack.push(seed);
    while (stack.length) {
      const t = stack.pop()!;
      faces.push(t);
      for (let k = 0; k < 3; k++) {
        const n = neighbours[t * 3 + k];
        if (n >= 0 && flat[n] && region[n] < 0) {
          region[n] = seed;
          stack.push(n);
        }
      }
    }
    let x0 = Infinity,
      x1 = -Infinity,
      y0 = Infinity,
      y1 = -Infinity,
      zSum = 0,
      areaSum = 0;
    for (const t of faces) {
      for (let k = 0; k < 3; k++) {
        const v = idx[t * 3 + k] * 3;
        x0 = Math.min(x0, p[v]);
        x1 = Math.max(x1, p[v]);
        y0 = Math.min(y0, p[v + 1]);
        y1 = Math.max(y1, p[v + 1]);
        zSum += p[v + 2] * area[t];
      }
      areaSum += area[t];
    }
    const zMm = zSum / (3 * areaSum);
    // Held at both ends along x, along y, or both: the span is the extent between the holding walls.
    const reachX = Math.max((x1 - x0) * 0.1, 0.5);
    const reachY = Math.max((y1 - y0) * 0.1, 0.5);
    let heldX0 = false,
      heldX1 = false,
      heldY0 = false,
      heldY1 = false;
    for (const t of faces) {
      for (let k = 0; k < 3; k++) {
        const n = neighbours[t * 3 + k];
        if (n >= 0 && region[n] === seed) continue;
        // a boundary edge: does the part go down from here (a wall under the edge)?
        if (n < 0 || minZ[n] > zMm - 0.5) continue;
        const va = idx[t * 3 + k] * 3;
        const vb = idx[t * 3 + ((k + 1) % 3)] * 3;
        const mx = (p[va] + p[vb]) / 2;
        const my = (p[va + 1] + p[vb + 1]) / 2;
        const alongY = Math.abs(p[va] - p[vb]) <= Math.abs(p[va + 1] - p[vb + 1]); // edge runs along y: holds x ends
        if (alongY && mx <= x0 + reachX) heldX0 = true;
        if (alongY && mx >= x1 - reachX) heldX1 = true;
        if (!alongY && my <= y0 + reachY) heldY0 = true;
        if (!alongY && my >= y1 - reachY) heldY1 = true;
      }
    }
    const spans: number[] = [];
    if (heldX0 && heldX1) spans.push(x1 - x0);
    if (heldY0 && heldY1) spans.push(y1 - y0);
    if (spans.length === 0) continue;
    const span = Math.min(...spans);
    bridges.push({
      spanMm: span,
      areaMm2: areaSum,
      zMm,
      centerMm: [(x0 + x1) / 2, (y0 + y1) / 2, zMm],
      status: span > fail ? 'fail' : span > warn ? 'warn' : 'ok',
    });
  }
  return bridges.sort((a, b) => b.spanMm - a.spanMm);
}
