import { Box3, BufferAttribute, BufferGeometry, Color, Sphere, Vector3 } from 'three';
import type { IndexedMesh } from '../../../shared/schemas/mesh';
import { PALETTE } from '../../styles/palette';

/** Surface colour of faces that print without support when no filament colour is given (linear RGB). */
export const SURFACE_RGB: readonly [number, number, number] = [0.78, 0.74, 0.66];
/** Overhang just past the threshold: the palette's slate (the legend's swatch starts here). */
export const OVERHANG_MILD_HEX = PALETTE.slate;
/** Overhang facing straight down (a ceiling): the palette's rust (the legend's swatch ends here). */
export const OVERHANG_STEEP_HEX = PALETTE.rust;

/** Options of {@link meshToBufferGeometry}. */
export interface MeshColourOptions {
  /** Filament colour of the surface, sRGB `#rrggbb`; a neutral stone colour when omitted. */
  surfaceHex?: string | null;
  /** The overhang threshold in degrees from vertical that the mask was made with (45 by default). */
  overhangDeg?: number;
}

/** sRGB hex → linear RGB triple (what vertex colours hold). */
function linearRgb(hex: string): [number, number, number] {
  const colour = new Color(hex);
  return [colour.r, colour.g, colour.b];
}

/**
 * The colour of an overhang face by how steeply it faces down: from slate just past the threshold to rust for a
 * face looking straight down, so the worst faces stand out and the gradient matches the legend.
 * @param nz - z of the face's unit normal (negative for faces looking down)
 * @param thresholdDeg - overhang threshold from vertical
 * @param mild - linear RGB at the threshold
 * @param steep - linear RGB facing straight down
 */
export function overhangRgb(
  nz: number,
  thresholdDeg: number,
  mild: readonly number[],
  steep: readonly number[],
): [number, number, number] {
  const fromVerticalDeg = (Math.asin(Math.min(1, Math.max(0, -nz))) * 180) / Math.PI;
  const t = Math.min(1, Math.max(0, (fromVerticalDeg - thresholdDeg) / Math.max(1e-6, 90 - thresholdDeg)));
  return [0, 1, 2].map((k) => mild[k] + (steep[k] - mild[k]) * t) as [number, number, number];
}

/** Per-vertex arrays of a flat-shaded, non-indexed geometry (nine floats per triangle each). */
interface FlatArrays {
  positions: Float32Array;
  normals: Float32Array;
  colors: Float32Array;
}

/**
 * Builds a flat-shaded, non-indexed BufferGeometry from the neutral mesh, one colour per triangle: the filament
 * colour, and overhang faces tinted by steepness ({@link overhangRgb}). Flat shading keeps the facets honest.
 * @param mesh - the neutral indexed mesh in millimetres
 * @param overhangMask - optional per-triangle flag (1 = overhang beyond the self-supporting angle)
 * @param options - surface colour and overhang threshold
 * @param capacityTriangles - room for at least this many triangles (only the mesh's are drawn), so a later mesh of
 *   up to that size is written in place by {@link updateBufferGeometry}
 */
export function meshToBufferGeometry(
  mesh: IndexedMesh,
  overhangMask?: Uint8Array | null,
  options: MeshColourOptions = {},
  capacityTriangles = 0,
): BufferGeometry {
  const size = Math.max(mesh.indices.length, capacityTriangles * 3) * 3;
  const arrays = { positions: new Float32Array(size), normals: new Float32Array(size), colors: new Float32Array(size) };
  writeFlatShaded(mesh, overhangMask, options, arrays);
  const geometry = new BufferGeometry();
  geometry.setAttribute('position', new BufferAttribute(arrays.positions, 3));
  geometry.setAttribute('normal', new BufferAttribute(arrays.normals, 3));
  geometry.setAttribute('color', new BufferAttribute(arrays.colors, 3));
  geometry.setDrawRange(0, mesh.indices.length);
  setBounds(geometry, arrays.positions, mesh.indices.length);
  return geometry;
}

/** Triangles a geometry made by {@link meshToBufferGeometry} has room for. */
export function geometryCapacityTriangles(geometry: BufferGeometry): number {
  const position = geometry.getAttribute('position');
  return position ? position.count / 3 : 0;
}

/**
 * Rewrites a geometry made by {@link meshToBufferGeometry} for a new mesh that fits in its buffers, in place: only
 * the part holding the new triangles is sent to the GPU and drawn (no new buffers, no garbage), as while a slider
 * moves and the triangle count changes from one draft to the next.
 * @param geometry - the geometry on screen
 * @param mesh - the new mesh
 * @param overhangMask - as for {@link meshToBufferGeometry}
 * @param options - as for {@link meshToBufferGeometry}
 * @returns false (and nothing changed) when the mesh has more triangles than the buffers hold: build a new geometry
 */
export function updateBufferGeometry(
  geometry: BufferGeometry,
  mesh: IndexedMesh,
  overhangMask?: Uint8Array | null,
  options: MeshColourOptions = {},
): boolean {
  const position = geometry.getAttribute('position');
  const normal = geometry.getAttribute('normal');
  const color = geometry.getAttribute('color');
  const used = mesh.indices.length * 3;
  if (
    !(position instanceof BufferAttribute) ||
    !(normal instanceof BufferAttribute) ||
    !(color instanceof BufferAttribute)
  )
    return false;
  if (position.array.length < used) return false;
  writeFlatShaded(mesh, overhangMask, options, {
    positions: position.array as Float32Array,
    normals: normal.array as Float32Array,
    colors: color.array as Float32Array,
  });
  for (const attribute of [position, normal, color]) {
    attribute.clearUpdateRanges();
    attribute.addUpdateRange(0, used);
    attribute.needsUpdate = true;
  }
  geometry.setDrawRange(0, mesh.indices.length);
  setBounds(geometry, position.array as Float32Array, mesh.indices.length);
  return true;
}

/** Bounding box and sphere of the first `vertexCount` vertices (the rest of the buffers is spare room). */
function setBounds(geometry: BufferGeometry, positions: Float32Array, vertexCount: number): void {
  const box = (geometry.boundingBox ??= new Box3());
  box.makeEmpty();
  const point = new Vector3();
  for (let i = 0; i < vertexCount * 3; i += 3)
    box.expandByPoint(point.set(positions[i], positions[i + 1], positions[i + 2]));
  const sphere = (geometry.boundingSphere ??= new Sphere());
  box.getCenter(sphere.center);
  let farthest = 0;
  for (let i = 0; i < vertexCount * 3; i += 3)
    farthest = Math.max(
      farthest,
      sphere.center.distanceToSquared(point.set(positions[i], positions[i + 1], positions[i + 2])),
    );
  sphere.radius = Math.sqrt(farthest);
}

function writeFlatShaded(
  mesh: IndexedMesh,
  overhangMask: Uint8Array | null | undefined,
  options: MeshColourOptions,
  { positions, normals, colors }: FlatArrays,
): void {
  const surface = options.surfaceHex ? linearRgb(options.surfaceHex) : SURFACE_RGB;
  const mild = linearRgb(OVERHANG_MILD_HEX);
  const steep = linearRgb(OVERHANG_STEEP_HEX);
  const thresholdDeg = options.overhangDeg ?? 45;
  const triangleCount = mesh.indices.length / 3;
  const useMask = overhangMask != null && overhangMask.length === triangleCount;
  for (let t = 0; t < triangleCount; t++) {
    const ia = mesh.indices[t * 3] * 3;
    const ib = mesh.indices[t * 3 + 1] * 3;
    const ic = mesh.indices[t * 3 + 2] * 3;
    const ax = mesh.positions[ia],
      ay = mesh.positions[ia + 1],
      az = mesh.positions[ia + 2];
    const bx = mesh.positions[ib],
      by = mesh.positions[ib + 1],
      bz = mesh.positions[ib + 2];
    const cx = mesh.positions[ic],
      cy = mesh.positions[ic + 1],
      cz = mesh.positions[ic + 2];
    const ux = bx - ax,
      uy = by - ay,
      uz = bz - az;
    const vx = cx - ax,
      vy = cy - ay,
      vz = cz - az;
    let nx = uy * vz - uz * vy,
      ny = uz * vx - ux * vz,
      nz = ux * vy - uy * vx;
    const length = Math.hypot(nx, ny, nz) || 1;
    nx /= length;
    ny /= length;
    nz /= length;
    const rgb = useMask && overhangMask[t] ? overhangRgb(nz, thresholdDeg, mild, steep) : surface;
    const o = t * 9;
    positions[o] = ax;
    positions[o + 1] = ay;
    positions[o + 2] = az;
    positions[o + 3] = bx;
    positions[o + 4] = by;
    positions[o + 5] = bz;
    positions[o + 6] = cx;
    positions[o + 7] = cy;
    positions[o + 8] = cz;
    for (let k = 0; k < 3; k++) {
      normals[o + k * 3] = nx;
      normals[o + k * 3 + 1] = ny;
      normals[o + k * 3 + 2] = nz;
      colors[o + k * 3] = rgb[0];
      colors[o + k * 3 + 1] = rgb[1];
      colors[o + k * 3 + 2] = rgb[2];
    }
  }
}
