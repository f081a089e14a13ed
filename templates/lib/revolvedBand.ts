import type { IndexedMesh } from '../../shared/schemas/mesh';
import { numberByFirstUse } from './partMesh';
import type { Outline } from './Solid';

/**
 * Joins a band of a solid of revolution, built here in JS, to a mesh that holds the rest of the same revolution cut off
 * by the horizontal plane z = seamZ (made by the kernel, with its flat cap on that plane still in place and untouched):
 * the cap is dropped and the band's two seam rings are welded to the cap's ring vertices. The band never goes through
 * the kernel, and a kernel operation on the rest costs in proportion to the triangles it gets, so leaving the band out
 * of a boolean that cannot reach it saves that part of the boolean's cost.
 * @param rest - the kernel's mesh of the other part (above the seam), its cap facing down at z = seamZ
 * @param band - the band's closed (r, z) outline, counter-clockwise, below the seam; its edge from point `seamEdge` to
 *   the next lies on the seam (that edge is the cap and gets no surface)
 * @param seamEdge - index of the outline point where the seam edge starts
 * @param segments - segments round the axis, as in the kernel's revolve (vertex k at angle 360° · k / segments)
 * @param zOffset - added to every band height (the rest is already moved by it)
 * @returns the closed mesh, or null when the cap is not where it should be (then the caller revolves in one piece)
 */
export function joinRevolvedBand(
  rest: IndexedMesh,
  band: Outline,
  seamEdge: number,
  segments: number,
  zOffset: number,
): IndexedMesh | null {
  const { positions, indices } = rest;
  const n = band.length;
  const outer = band[seamEdge];
  const inner = band[(seamEdge + 1) % n];
  const seamZ = outer[1] + zOffset;
  if (Math.abs(inner[1] - outer[1]) > 1e-9 || inner[0] <= 0 || outer[0] <= 0) return null;
  // The cap: triangles facing down with all three corners on the seam plane.
  const onSeam = (id: number): boolean => Math.abs(positions[id * 3 + 2] - seamZ) < 1e-4;
  const cap = new Uint8Array(indices.length / 3);
  const ringVertex = new Int32Array(segments * 2).fill(-1);
  const step = (2 * Math.PI) / segments;
  for (let tri = 0; tri < cap.length; tri++) {
    const [a, b, c] = [indices[tri * 3], indices[tri * 3 + 1], indices[tri * 3 + 2]];
    if (!onSeam(a) || !onSeam(b) || !onSeam(c)) continue;
    const nz =
      (positions[b * 3] - positions[a * 3]) * (positions[c * 3 + 1] - positions[a * 3 + 1]) -
      (positions[c * 3] - positions[a * 3]) * (positions[b * 3 + 1] - positions[a * 3 + 1]);
    if (nz >= 0) continue;
    cap[tri] = 1;
    for (const id of [a, b, c]) {
      const x = positions[id * 3];
      const y = positions[id * 3 + 1];
      const radius = Math.hypot(x, y);
      const k = ((Math.round(Math.atan2(y, x) / step) % segments) + segments) % segments;
      const slot = k * 2 + (Math.abs(radius - outer[0]) < Math.abs(radius - inner[0]) ? 0 : 1);
      if (ringVertex[slot] >= 0 && ringVertex[slot] !== id) return null;
      ringVertex[slot] = id;
    }
  }
  if (ringVertex.some((id) => id < 0)) return null;

  // The band's vertices: one per outline point and angle (one per point on the axis), the seam's taken from the cap.
  const added: number[] = [];
  const vertexCount = positions.length / 3;
  const ids: Int32Array[] = band.map(([r, z], i) => {
    const row = new Int32Array(segments);
    for (let k = 0; k < segments; k++) {
      if (i === seamEdge || i === (seamEdge + 1) % n) row[k] = ringVertex[k * 2 + (i === seamEdge ? 0 : 1)];
      else if (r === 0 && k > 0) row[k] = row[0];
      else {
        const angle = step * k;
        row[k] = vertexCount + added.length / 3;
        added.push(r * Math.cos(angle), r * Math.sin(angle), z + zOffset);
      }
    }
    return row;
  });
  const triangles: number[] = [];
  for (let i = 0; i < n; i++) {
    if (i === seamEdge) continue;
    const j = (i + 1) % n;
    for (let k = 0; k < segments; k++) {
      const m = (k + 1) % segments;
      // Counter-clockwise in (r, z) with the angle growing: (a, c, b) and (a, d, c) face outward.
      const [a, b, c, d] = [ids[i][k], ids[j][k], ids[j][m], ids[i][m]];
      if (b !== c) triangles.push(a, c, b);
      if (a !== d) triangles.push(a, d, c);
    }
  }
  let kept = 0;
  for (let tri = 0; tri < cap.length; tri++) if (!cap[tri]) kept++;
  const out = new Uint32Array(kept * 3 + triangles.length);
  let o = 0;
  for (let tri = 0; tri < cap.length; tri++)
    if (!cap[tri]) {
      out[o++] = indices[tri * 3];
      out[o++] = indices[tri * 3 + 1];
      out[o++] = indices[tri * 3 + 2];
    }
  for (const id of triangles) out[o++] = id;
  const xyz = new Float32Array(positions.length + added.length);
  xyz.set(positions);
  xyz.set(added, positions.length);
  return numberByFirstUse({ positions: xyz, indices: out });
}
