import { floorPlug } from './floorPlug';
import { Solid, type Outline } from './Solid';
import { circleOutline } from './meshBuilder';

/** Where the floor is and what goes through it. */
export interface FloorOpeningOptions {
  /** Diameter of the round cleaning opening (also sets the drainage ring, 12 mm inside its edge). */
  openingDiameterMm: number;
  /** Thickness of the floor the opening or the drainage holes pass through. */
  floorThicknessMm: number;
  /** Height of the floor's underside in the caller's coordinates. */
  floorBottomZMm: number;
  /** A removable floor plug (true) or drainage holes through a solid floor (false). */
  cleaningAccess: boolean;
  /** Gap per side between plug and opening. */
  clearanceMm: number;
  /** Vertical 6 mm drainage holes on a ring (in the plug, or in the floor when there is no plug). */
  drainageHoles: number;
  /** Segments round the opening and the plug (64 unless a draft asks for fewer). */
  segments?: number;
  /** Draft: coarser drainage holes and a plug built with fewer booleans (see {@link floorPlug}). */
  draft?: boolean;
  /** False when only the cuts are wanted: the plug is then not built at all. */
  withPlug?: boolean;
}

/** The cuts a floor needs and the plug that fills its opening, if any. */
export interface FloorOpening {
  /** Solids to subtract from the body. */
  cuts: Solid[];
  /** The cleaning plug, centred on the origin and resting on z = 0; undefined without cleaning access or `withPlug`. */
  plug: Solid | undefined;
}

/**
 * Cleaning opening with its floor plug, or, without cleaning access, a ring of vertical drainage holes through the
 * solid floor. Both are centred on the z axis.
 * @param options - opening size, floor position and thickness, and what to cut
 */
export function floorOpening(options: FloorOpeningOptions): FloorOpening {
  const { openingDiameterMm, floorThicknessMm, floorBottomZMm, drainageHoles } = options;
  const segments = options.segments ?? 64;
  if (options.cleaningAccess) {
    return {
      cuts: [Solid.cylinder(floorThicknessMm + 2, openingDiameterMm / 2, segments).translate(0, 0, floorBottomZMm - 1)],
      plug:
        options.withPlug === false
          ? undefined
          : floorPlug({
              openingDiameterMm,
              seatThicknessMm: floorThicknessMm,
              clearanceMm: options.clearanceMm,
              drainageHoles,
              segments,
              ...(options.draft ? { holeSegments: 8, direct: true } : {}),
            }),
    };
  }
  const ring = openingDiameterMm / 2 - 12;
  const cuts = Array.from({ length: drainageHoles }, (_, i) => {
    const angle = (2 * Math.PI * (i + 0.5)) / drainageHoles;
    return Solid.cylinder(floorThicknessMm + 2, 3, options.draft ? 8 : 16).translate(
      ring * Math.cos(angle),
      ring * Math.sin(angle),
      floorBottomZMm - 1,
    );
  });
  return { cuts, plug: undefined };
}

/**
 * The holes {@link floorOpening} cuts, as outlines in the (x, y) plane (counter-clockwise), for drafts that build the
 * floor with its holes as one mesh: the cleaning opening, or the ring of drainage holes.
 * @param options - as for {@link floorOpening} (the plug is not built)
 */
export function floorOpeningOutlines(options: FloorOpeningOptions): Outline[] {
  const segments = options.segments ?? 64;
  if (options.cleaningAccess) return [circleOutline(options.openingDiameterMm / 2, segments)];
  const ring = options.openingDiameterMm / 2 - 12;
  return Array.from({ length: options.drainageHoles }, (_, i) => {
    const angle = (2 * Math.PI * (i + 0.5)) / options.drainageHoles;
    return circleOutline(3, options.draft ? 8 : 16, [ring * Math.cos(angle), ring * Math.sin(angle)]);
  });
}
