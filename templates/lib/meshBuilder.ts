import type { Vec3 } from 'manifold-3d';
import { Earcut } from 'three/src/extras/Earcut.js';
import { Solid, type Outline } from './Solid';

/** One loop of a planar face: its points in the face's 2D frame and the mesh vertices they are. */
export interface FaceLoop {
  points: Outline;
  ids: number[];
}

/**
 * Builds a closed triangle mesh face by face, for solids whose faces are known (drafts that skip booleans): planar
 * faces with holes are triangulated by the kernel's polygon triangulator, and walls join two rings of vertices. The
 * caller shares vertices between faces, so the result is closed; `solid()` hands it to the kernel, which checks it.
 */
export class MeshBuilder {
  private readonly positions: number[] = [];
  private readonly indices: number[] = [];

  /** Adds a vertex and returns its number. */
  vertex(x: number, y: number, z: number): number {
    this.positions.push(x, y, z);
    return this.positions.length / 3 - 1;
  }

  /**
   * Adds a ring of vertices: `place(u, v)` maps each 2D point to 3D.
   * @returns the vertex numbers, in the loop's order
   */
  ring(points: Outline, place: (u: number, v: number) => Vec3): number[] {
    return points.map(([u, v]) => this.vertex(...place(u, v)));
  }

  /**
   * A planar face: outer loops and hole loops (any winding; they are oriented here) in a 2D frame (u, v) of the plane.
   * @param outers - the face's outer boundaries
   * @param holes - its holes
   * @param alongFrameNormal - true when the solid's outward normal is u × v, false when it is −(u × v)
   */
  face(outers: FaceLoop[], holes: FaceLoop[], alongFrameNormal: boolean): void {
    const loops = [...outers.map((l) => oriented(l, true)), ...holes.map((l) => oriented(l, false))];
    const ids = loops.flatMap((l) => l.ids);
    const flat = loops.flatMap((l) => l.points.flat());
    const holeStarts: number[] = [];
    let start = 0;
    for (const l of loops) {
      if (start > 0 && signedArea(l.points) < 0) holeStarts.push(start);
      start += l.points.length;
    }
    // Counter-clockwise in (u, v) gives the normal u × v.
    this.indices.push(...earClip(flat, ids, holeStarts, alongFrameNormal));
  }

  /**
   * The wall between two rings of the same loop (a quad per side): `from` lies before `to` along the frame normal
   * u × v of the loop's points.
   * @param loop - the loop's points in (u, v) (any winding)
   * @param from - its vertices on the first plane
   * @param to - its vertices on the second plane
   * @param outward - true when the solid lies inside the loop (an outside wall), false for the wall of a hole
   * @param skipSide - a side left out (the caller builds that face itself): the one from point k to point k + 1
   */
  wall(loop: Outline, from: number[], to: number[], outward: boolean, skipSide = -1): void {
    const reverse = signedArea(loop) < 0;
    const n = loop.length;
    for (let k = 0; k < n; k++) {
      // Walking the loop counter-clockwise in (u, v), from ring `from` to ring `to` along u × v.
      let i = k;
      let j = (k + 1) % n;
      if (reverse) [i, j] = [n - 1 - k, (2 * n - 2 - k) % n];
      if ((reverse ? j : i) === skipSide) continue;
      const [a, b, c, d] = [from[i], from[j], to[j], to[i]];
      if (outward) this.indices.push(a, b, c, a, c, d);
      else this.indices.push(a, c, b, a, d, c);
    }
  }

  /** Appends raw triangles (vertex numbers), already wound outward. */
  triangles(indices: number[]): void {
    this.indices.push(...indices);
  }

  /** The built mesh as a kernel solid. */
  solid(): Solid {
    return Solid.fromMesh(new Float32Array(this.positions), new Uint32Array(this.indices));
  }
}

/** Signed area of a 2D loop (positive when counter-clockwise). */
/**
 * Ear-clips a planar face given in a 2D frame and returns its triangles as vertex numbers, wound so that their
 * normal is u × v when `alongFrameNormal` (else its opposite). Ear clipping in JS: for faces of a few dozen points it
 * is several times cheaper than a call into the kernel.
 * @param flat - the loops' points, u and v in turn
 * @param ids - the vertex number of each point
 * @param holeStarts - where each hole loop starts, in points
 * @param alongFrameNormal - whether the outward normal is u × v
 */
export function earClip(flat: number[], ids: number[], holeStarts: number[], alongFrameNormal: boolean): number[] {
  const triangles = Earcut.triangulate(flat, holeStarts, 2);
  // Its triangles share one winding; the sign of their total area says which.
  let area = 0;
  for (let k = 0; k < triangles.length; k += 3) {
    const [a, b, c] = [triangles[k] * 2, triangles[k + 1] * 2, triangles[k + 2] * 2];
    area += (flat[b] - flat[a]) * (flat[c + 1] - flat[a + 1]) - (flat[c] - flat[a]) * (flat[b + 1] - flat[a + 1]);
  }
  const keep = area > 0 === alongFrameNormal;
  const out: number[] = [];
  for (let k = 0; k < triangles.length; k += 3) {
    const [a, b, c] = [ids[triangles[k]], ids[triangles[k + 1]], ids[triangles[k + 2]]];
    if (keep) out.push(a, b, c);
    else out.push(a, c, b);
  }
  return out;
}

export function signedArea(points: Outline): number {
  let area = 0;
  for (let k = 0; k < points.length; k++) {
    const [x0, y0] = points[k];
    const [x1, y1] = points[(k + 1) % points.length];
    area += x0 * y1 - x1 * y0;
  }
  return area / 2;
}

/** The loop wound counter-clockwise (`ccw`) or clockwise. */
function oriented(loop: FaceLoop, ccw: boolean): FaceLoop {
  return signedArea(loop.points) > 0 === ccw
    ? loop
    : { points: [...loop.points].reverse(), ids: [...loop.ids].reverse() };
}

/** A circle of `segments` points, counter-clockwise, starting at angle 0. */
export function circleOutline(radiusMm: number, segments: number, centre: [number, number] = [0, 0]): Outline {
  return Array.from({ length: segments }, (_, i): [number, number] => {
    const angle = (2 * Math.PI * i) / segments;
    return [centre[0] + radiusMm * Math.cos(angle), centre[1] + radiusMm * Math.sin(angle)];
  });
}
