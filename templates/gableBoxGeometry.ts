/**
 * The gable box's geometry: its inside frame (heights, roof lines, highest entry), the shell with its trim, vents and
 * hanging hole, and the floor plug with its drainage holes. The template in `gableBox.ts` adds the entry and perch.
 */
import type { BuildContext } from './lib/BuildContext';
import { Solid, type Outline } from './lib/Solid';
import { slotOutline, teardropOutline, TEARDROP_TIP_RADII } from './lib/teardrop';
import { shingleRows, SHINGLE_PROUD_MM } from './lib/shingleRows';
import type { GableParams, PLUG_KEYS, SHELL_KEYS } from './gableBoxParameters';

/** Height of the floor plug's boss that fits into the open bottom of the box. */
const PLUG_BOSS_MM = 8;
export const SLOT_WIDTH_MM = 6;
export const SLOT_LENGTH_MM = 30;
const DRAIN_DIAMETER_MM = 6;
const HANGING_HOLE_MM = 6;
export const HOLE_SEGMENTS = 48;

/**
 * The gable's inside frame from the parameters: floor and eaves heights, the roof's underside and outside, the
 * flat ridge strip, and the highest the entry's bottom edge may sit (3 mm of wall between the hole and the roof).
 */
export function gableFrame(
  p: Pick<
    GableParams,
    | 'floorWidthMm'
    | 'floorDepthMm'
    | 'cavityDepthMm'
    | 'wallThicknessMm'
    | 'roofPitchDeg'
    | 'ridgeFlatMm'
    | 'roofOverhangMm'
  > &
    Partial<Pick<GableParams, 'entryHoleDiameterMm'>>,
) {
  const t = p.wallThicknessMm;
  const W = p.floorWidthMm;
  const D = p.floorDepthMm;
  const tan = Math.tan((p.roofPitchDeg * Math.PI) / 180);
  const cos = Math.cos((p.roofPitchDeg * Math.PI) / 180);
  const sin = Math.sin((p.roofPitchDeg * Math.PI) / 180);
  const Wo = W + 2 * t;
  const o = p.roofOverhangMm;
  const floorZ = PLUG_BOSS_MM;
  const eavesZ = floorZ + p.cavityDepthMm;
  /** Underside of the roof (= top of the cavity) at horizontal distance x from the centre line. */
  const innerRoofZ = (x: number): number => eavesZ + (W / 2 - Math.abs(x)) * tan;
  const roofThicknessZ = t / cos;
  const outerRoofZ = (x: number): number => innerRoofZ(x) + roofThicknessZ;
  const flatZ = outerRoofZ(p.ridgeFlatMm / 2);
  // Keep at least a wall's thickness of roof under the flat ridge strip.
  const innerApexZ = Math.min(innerRoofZ(0), flatZ - t);
  const r = (p.entryHoleDiameterMm ?? 0) / 2;
  const highestCentreZ = Math.min(innerRoofZ(r), innerApexZ) - 3 - r;
  const maxHoleAboveFloorMm = highestCentreZ - TEARDROP_TIP_RADII * r - floorZ;
  return { t, W, D, tan, sin, Wo, o, floorZ, eavesZ, innerRoofZ, outerRoofZ, flatZ, innerApexZ, maxHoleAboveFloorMm };
}

/** Top of the cavity outline: the two roof planes, cut flat where the ridge strip would leave the roof too thin. */
function apexPoints(apexZ: number, innerRoofZ: (x: number) => number, tan: number, W: number): Outline {
  if (apexZ >= innerRoofZ(0) - 1e-9) return [[0, innerRoofZ(0)]];
  const halfFlat = W / 2 - (apexZ - innerRoofZ(W / 2)) / tan;
  return [
    [halfFlat, apexZ],
    [-halfFlat, apexZ],
  ];
}

/** Vertical V-grooves (45° flanks) on the front and side walls, stopping under the roof. */
function boardGrooves(W: number, D: number, t: number, innerRoofZ: (x: number) => number): Solid[] {
  const depth = 1.2;
  const grooves: Solid[] = [];
  const Wo = W + 2 * t;
  const frontY = -D / 2 - t;
  for (let x = -Wo / 2 + 20; x <= Wo / 2 - 20 + 1e-9; x += 20) {
    const v: Outline = [
      [x - depth, frontY - 1],
      [x + depth, frontY - 1],
      [x, frontY + depth],
    ];
    grooves.push(Solid.prism(v, 'z', -1, innerRoofZ(Math.abs(x) + depth) - 1));
  }
  const sideTop = innerRoofZ(Wo / 2) - 1;
  for (let y = frontY + 20; y <= D / 2 + t - 20 + 1e-9; y += 20) {
    for (const side of [-1, 1]) {
      const face = (side * Wo) / 2;
      const v: Outline =
        side > 0
          ? [
              [face - depth, y],
              [face + 1, y - depth - 1],
              [face + 1, y + depth + 1],
            ]
          : [
              [face + depth, y],
              [face - 1, y + depth + 1],
              [face - 1, y - depth - 1],
            ];
      grooves.push(Solid.prism(v, 'z', -1, sideTop));
    }
  }
  return grooves;
}

/** Vertical drainage holes through the floor plug: corners first, then edge midpoints. */
function drainHoles(W: number, D: number, count: number, heightMm: number, segments: number): Solid[] {
  const ix = W / 2 - 15;
  const iy = D / 2 - 15;
  const spots: [number, number][] = [
    [-ix, -iy],
    [ix, -iy],
    [ix, iy],
    [-ix, iy],
    [0, -iy],
    [ix, 0],
    [0, iy],
    [-ix, 0],
  ];
  return spots
    .slice(0, count)
    .map(([x, y]) => Solid.cylinder(heightMm + 2, DRAIN_DIAMETER_MM / 2, segments).translate(x, y, -1));
}

/** The floor plug (flat plate with a boss that fits the open bottom, drainage holes), centred on the origin. */
export function gablePlug(p: Pick<GableParams, (typeof PLUG_KEYS)[number]>, context: BuildContext): Solid {
  const t = p.wallThicknessMm;
  const W = p.floorWidthMm;
  const D = p.floorDepthMm;
  const Wo = W + 2 * t;
  const c = p.printClearanceMm;
  return Solid.box([Wo, D + 2 * t, t], [-Wo / 2, -D / 2 - t, 0])
    .add(Solid.box([W - 2 * c, D - 2 * c, PLUG_BOSS_MM + 0.01], [-W / 2 + c, -D / 2 + c, t - 0.01]))
    .subtract(...drainHoles(W, D, p.drainageHoles, t + PLUG_BOSS_MM, context.pick(16, 6)));
}

/** Walls, roof and trim less the cavity, vents and hanging hole, upright (floor at z = 0, entry side −y). */
export function gableShell(p: Pick<GableParams, (typeof SHELL_KEYS)[number]>, context: BuildContext): Solid {
  const { t, W, D, tan, sin, Wo, o, eavesZ, innerRoofZ, outerRoofZ, flatZ, innerApexZ } = gableFrame(p);
  const frontY = -D / 2 - t;
  const wallsOutline: Outline = [
    [-Wo / 2, 0],
    [Wo / 2, 0],
    [Wo / 2, innerRoofZ(Wo / 2) + 0.5],
    [0, innerRoofZ(0) + 0.5],
    [-Wo / 2, innerRoofZ(Wo / 2) + 0.5],
  ];
  const eaveX = Wo / 2 + o;
  const roofOutline: Outline = [
    [eaveX, innerRoofZ(eaveX)],
    [eaveX, outerRoofZ(eaveX)],
    [p.ridgeFlatMm / 2, flatZ],
    [-p.ridgeFlatMm / 2, flatZ],
    [-eaveX, outerRoofZ(eaveX)],
    [-eaveX, innerRoofZ(eaveX)],
    [0, innerRoofZ(0)],
  ];
  const cavityOutline: Outline = [
    [-W / 2, -1],
    [W / 2, -1],
    [W / 2, eavesZ],
    ...apexPoints(innerApexZ, innerRoofZ, tan, W),
    [-W / 2, eavesZ],
  ];

  const additions: Solid[] = [Solid.prism(roofOutline, 'y', frontY - o, D / 2 + t)];
  const cuts: Solid[] = [Solid.prism(cavityOutline, 'y', -D / 2, D / 2)];

  if (p.hangingHole) {
    const z = innerApexZ - HANGING_HOLE_MM * 1.5;
    cuts.push(
      Solid.prism(
        teardropOutline(HANGING_HOLE_MM, context.pick(16, 8), false),
        'y',
        D / 2 - 1,
        D / 2 + t + 1,
      ).translate(0, 0, z),
    );
  }

  const slotTopZ = innerRoofZ(Wo / 2) - 6;
  for (let i = 0; i < p.ventilationSlots; i++) {
    const y = -D / 2 + ((i + 0.5) * D) / p.ventilationSlots;
    const slot = slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [
      u + y,
      v + slotTopZ - SLOT_LENGTH_MM / 2,
    ]);
    cuts.push(Solid.prism(slot, 'x', -Wo / 2 - 1, Wo / 2 + 1));
  }

  if (p.trimStyle === 'boards') cuts.push(...boardGrooves(W, D, t, innerRoofZ));
  if (p.trimStyle === 'shingles') {
    const firstRowX = p.ridgeFlatMm / 2 + SHINGLE_PROUD_MM / sin + 1;
    additions.push(
      ...shingleRows({
        fromXMm: firstRowX,
        toXMm: eaveX,
        outerZ: outerRoofZ,
        pitchDeg: p.roofPitchDeg,
        fromYMm: frontY - o,
        toYMm: D / 2 + t,
        slabs: context.draft,
      }),
    );
  }
  return Solid.prism(wallsOutline, 'y', frontY, D / 2 + t)
    .add(...additions)
    .subtract(...cuts);
}
