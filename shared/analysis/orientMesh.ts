import type { IndexedMesh } from '../schemas/mesh';
import type { BuildOrientation, AxisUp } from '../schemas/analysis';

/** A 3×3 rotation, row-major: p' = R·p. */
export type Rotation3 = [number, number, number, number, number, number, number, number, number];

/**
 * Rotations that bring each named direction of the model to +z (up). Each is a proper rotation (det = +1), so the
 * winding and the outward normals survive.
 */
export const AXIS_UP_ROTATIONS: Record<AxisUp, Rotation3> = {
  '+z': [1, 0, 0, 0, 1, 0, 0, 0, 1],
  '-z': [1, 0, 0, 0, -1, 0, 0, 0, -1],
  '+x': [0, 0, -1, 0, 1, 0, 1, 0, 0],
  '-x': [0, 0, 1, 0, 1, 0, -1, 0, 0],
  '+y': [1, 0, 0, 0, 0, -1, 0, 1, 0],
  '-y': [1, 0, 0, 0, 0, 1, 0, -1, 0],
};

/**
 * The rotation for a build orientation: a named model direction that should point up, or an explicit rotation.
 * @param orientation - '+z', '-x', … or `{ rotation }`
 * @returns the row-major rotation
 */
export function rotationFor(orientation: BuildOrientation): Rotation3 {
  if (typeof orientation === 'string') return AXIS_UP_ROTATIONS[orientation];
  return orientation.rotation as Rotation3;
}

/**
 * The smallest rotation that turns the model direction `down` to -z, so that side of the part faces the build plate.
 * @param down - a direction in model coordinates (need not be unit length)
 * @returns the row-major rotation
 */
export function rotationDownTo(down: readonly [number, number, number]): Rotation3 {
  const len = Math.hypot(down[0], down[1], down[2]);
  const a = [down[0] / len, down[1] / len, down[2] / len];
  const b = [0, 0, -1];
  const c = a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
  if (c > 1 - 1e-12) return [1, 0, 0, 0, 1, 0, 0, 0, 1];
  if (c < -1 + 1e-12) return AXIS_UP_ROTATIONS['-z'];
  // Rodrigues: axis v = a × b, R = I + [v]× + [v]×² / (1 + c)
  const v = [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
  const k = 1 / (1 + c);
  return [
    1 - (v[1] * v[1] + v[2] * v[2]) * k,
    -v[2] + v[0] * v[1] * k,
    v[1] + v[0] * v[2] * k,
    v[2] + v[0] * v[1] * k,
    1 - (v[0] * v[0] + v[2] * v[2]) * k,
    -v[0] + v[1] * v[2] * k,
    -v[1] + v[0] * v[2] * k,
    v[0] + v[1] * v[2] * k,
    1 - (v[0] * v[0] + v[1] * v[1]) * k,
  ];
}

/**
 * Rotates a mesh into build orientation and lifts it so its lowest point rests on the build plate (z = 0).
 * Triangle order and indices are kept, so per-face results map back to the input mesh.
 * @param mesh - the part in model coordinates, mm
 * @param orientation - which model direction points up, or an explicit rotation
 * @returns a new mesh sharing the input's indices
 */
export function orientMesh(mesh: IndexedMesh, orientation: BuildOrientation): IndexedMesh {
  const r = rotationFor(orientation);
  const src = mesh.positions;
  const out = new Float32Array(src.length);
  let minZ = Infinity;
  for (let i = 0; i < src.length; i += 3) {
    const x = src[i];
    const y = src[i + 1];
    const z = src[i + 2];
    out[i] = r[0] * x + r[1] * y + r[2] * z;
    out[i + 1] = r[3] * x + r[4] * y + r[5] * z;
    const zr = r[6] * x + r[7] * y + r[8] * z;
    out[i + 2] = zr;
    if (zr < minZ) minZ = zr;
  }
  if (Number.isFinite(minZ)) for (let i = 2; i < out.length; i += 3) out[i] -= minZ;
  return { positions: out, indices: mesh.indices };
}
