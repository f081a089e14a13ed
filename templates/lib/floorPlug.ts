import { Solid, type Outline } from './Solid';

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
   * Draft: the flange and the boss as one revolved L-shaped section instead of the union of two cylinders (the same
   * shape with one boolean fewer; the triangles differ, so full builds keep the union and their hashes).
   */
  revolved?: boolean;
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
  const holes = Array.from({ length: options.drainageHoles }, (_, i) => {
    const angle = (2 * Math.PI * (i + 0.5)) / options.drainageHoles;
    return Solid.cylinder(height + 2, 3, options.holeSegments ?? 16).translate(
      ring * Math.cos(angle),
      ring * Math.sin(angle),
      -1,
    );
  });
  if (options.revolved) {
    const flangeR = options.openingDiameterMm / 2 + FLANGE_MM;
    const bossR = options.openingDiameterMm / 2 - options.clearanceMm;
    const section: Outline = [
      [0, 0],
      [flangeR, 0],
      [flangeR, FLANGE_THICKNESS_MM],
      [bossR, FLANGE_THICKNESS_MM],
      [bossR, height],
      [0, height],
    ];
    return Solid.revolve(section, segments).subtract(...holes);
  }
  const flange = Solid.cylinder(FLANGE_THICKNESS_MM, options.openingDiameterMm / 2 + FLANGE_MM, segments);
  const boss = Solid.cylinder(
    options.seatThicknessMm + 0.01,
    options.openingDiameterMm / 2 - options.clearanceMm,
    segments,
  ).translate(0, 0, FLANGE_THICKNESS_MM - 0.01);
  return flange.add(boss).subtract(...holes);
}
