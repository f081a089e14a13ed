import { Solid } from './Solid';
import { circleOutline, MeshBuilder } from './meshBuilder';

/** Size of a round floor plug and its seat. */
export interface FloorPlugOptions {
  /** Diameter of the round opening in the floor. */
  openingDiameterMm: number;
  /** Thickness of the floor the plug fills, so its top is flush with the inside floor. */
  seatThicknessMm: number;
  /** Gap per side between plug and opening. */
  clearanceMm: number;
  /** Vertical 6 mm drainage holes on a ring. */
  drainageHoles: number;
  /** Segments round the flange and the boss (64 unless a draft asks for fewer). */
  segments?: number;
  /** Segments round each drainage hole (16 unless a draft asks for fewer). */
  holeSegments?: number;
  /**
   * Draft: the plug built straight as one mesh (flange, boss and drainage holes face by face) instead of the union of
   * two cylinders less the holes (the same shape with no boolean; the triangles differ, so full builds keep the
   * booleans and their hashes).
   */
  direct?: boolean;
}

/** Flange width beyond the opening, per side, and its thickness. */
const FLANGE_MM = 8;
const FLANGE_THICKNESS_MM = 3;

/**
 * Round cleaning plug printed as its own part, flange down: a boss that fills the floor opening (less the print
 * clearance) on a flange that stops it under the floor. Centred on the origin, resting on z = 0.
 * @param options - opening, seat and clearance sizes
 */
export function floorPlug(options: FloorPlugOptions): Solid {
  const segments = options.segments ?? 64;
  const height = FLANGE_THICKNESS_MM + options.seatThicknessMm;
  const ring = options.openingDiameterMm / 2 - 12;
  if (options.direct) return directPlug(options, segments, height, ring);
  const holes = Array.from({ length: options.drainageHoles }, (_, i) => {
    const angle = (2 * Math.PI * (i + 0.5)) / options.drainageHoles;
    return Solid.cylinder(height + 2, 3, options.holeSegments ?? 16).translate(
      ring * Math.cos(angle),
      ring * Math.sin(angle),
      -1,
    );
  });
  const flange = Solid.cylinder(FLANGE_THICKNESS_MM, options.openingDiameterMm / 2 + FLANGE_MM, segments);
  const boss = Solid.cylinder(
    options.seatThicknessMm + 0.01,
    options.openingDiameterMm / 2 - options.clearanceMm,
    segments,
  ).translate(0, 0, FLANGE_THICKNESS_MM - 0.01);
  return flange.add(boss).subtract(...holes);
}

/**
 * The plug as one mesh: a flange disc, a boss disc on it, and drainage holes through both, face by face (every face
 * is flat or a wall between two rings of one outline).
 */
function directPlug(options: FloorPlugOptions, segments: number, height: number, ring: number): Solid {
  const mesh = new MeshBuilder();
  const flange = circleOutline(options.openingDiameterMm / 2 + FLANGE_MM, segments);
  const boss = circleOutline(options.openingDiameterMm / 2 - options.clearanceMm, segments);
  const holes = Array.from({ length: options.drainageHoles }, (_, i) => {
    const angle = (2 * Math.PI * (i + 0.5)) / options.drainageHoles;
    return circleOutline(3, options.holeSegments ?? 16, [ring * Math.cos(angle), ring * Math.sin(angle)]);
  });
  const at =
    (z: number) =>
    (u: number, v: number): [number, number, number] => [u, v, z];
  const flangeBottom = mesh.ring(flange, at(0));
  const flangeTop = mesh.ring(flange, at(FLANGE_THICKNESS_MM));
  const bossBottom = mesh.ring(boss, at(FLANGE_THICKNESS_MM));
  const bossTop = mesh.ring(boss, at(height));
  const holeBottoms = holes.map((hole) => mesh.ring(hole, at(0)));
  const holeTops = holes.map((hole) => mesh.ring(hole, at(height)));
  // Faces in (x, y), frame normal +z: the underside faces down, the flange's top ring and the boss's top face up.
  const loops = (outlines: typeof holes, rings: number[][]) => outlines.map((points, k) => ({ points, ids: rings[k] }));
  mesh.face([{ points: flange, ids: flangeBottom }], loops(holes, holeBottoms), false);
  mesh.face([{ points: flange, ids: flangeTop }], [{ points: boss, ids: bossBottom }], true);
  mesh.face([{ points: boss, ids: bossTop }], loops(holes, holeTops), true);
  mesh.wall(flange, flangeBottom, flangeTop, true);
  mesh.wall(boss, bossBottom, bossTop, true);
  holes.forEach((hole, k) => mesh.wall(hole, holeBottoms[k], holeTops[k], false));
  return mesh.solid();
}
