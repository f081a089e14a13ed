/**
 * The A-frame's geometry: its frame (floor and apex heights, slopes), the highest entry, how many vents fit, the floor
 * opening and plug, the landing dowel, and the shell with its crest, trim and vents. The template in `aFrame.ts` adds
 * the entry and the perch.
 */
import type { BuildContext } from './lib/BuildContext';
import { floorOpening } from './lib/floorOpening';
import { shingleRows, SHINGLE_PROUD_MM } from './lib/shingleRows';
import { Solid, type Outline } from './lib/Solid';
import { slotOutline, teardropOutline } from './lib/teardrop';
import { DOWEL_KEYS, type AFrameParams, type FRAME_KEYS, type PLUG_KEYS, type SHELL_KEYS } from './aFrameParameters';

export const SLOT_WIDTH_MM = 6;
export const SLOT_LENGTH_MM = 30;
const HANGING_HOLE_MM = 5;
export const HOLE_SEGMENTS = 48;

/**
 * Landing dowel: a half-round bar lying flat on the build plate with a domed end, so every face points up or
 * sideways and it prints with the first layers. Built at the front wall's outside face (y = 0), reaching to −y.
 */
export function landingDowel(lengthMm: number, context: BuildContext): Solid {
  const radius = 7;
  const halfRound: Outline = [];
  const halfSteps = context.pick(16, 8);
  for (let i = 0; i <= halfSteps; i++) {
    const angle = (Math.PI * i) / halfSteps;
    halfRound.push([radius * Math.cos(angle), radius * Math.sin(angle)]);
  }
  const bar = Solid.prism(halfRound, 'y', -lengthMm, 1);
  const quarter: Outline = [[0, 0]];
  const quarterSteps = context.pick(8, 4);
  for (let i = 0; i <= quarterSteps; i++) {
    const angle = (Math.PI / 2) * (i / quarterSteps);
    quarter.push([i === quarterSteps ? 0 : radius * Math.cos(angle), radius * Math.sin(angle)]);
  }
  const dome = Solid.revolve(quarter, context.pick(32, 16)).translate(0, -lengthMm, 0);
  return bar.add(dome);
}

/**
 * Highest the entry's bottom edge may sit above the floor: the hole's centre stays (r + 3) / cos below the apex so a
 * 3 mm rim remains between the hole and the sloped walls.
 */
export function aFrameMaxHoleAboveFloorMm(p: AFrameParams): number {
  const pitch = (p.roofPitchDeg * Math.PI) / 180;
  const slopeHeight = (p.floorWidthMm / 2) * Math.tan(pitch);
  const kneeMm = Math.max(0, p.cavityDepthMm - slopeHeight);
  const r = p.entryHoleDiameterMm / 2;
  return kneeMm + slopeHeight - (r + 3) / Math.cos(pitch) - r;
}

/** The A-frame's sizes from the parameters: floor and apex heights, inner and outer slopes, outside width. */
export function aFrameFrame(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number]>) {
  const t = p.wallThicknessMm;
  const W = p.floorWidthMm;
  const D = p.floorDepthMm;
  const pitch = (p.roofPitchDeg * Math.PI) / 180;
  const tan = Math.tan(pitch);
  const cos = Math.cos(pitch);
  const floorZ = t;
  const slopeHeight = (W / 2) * tan;
  const kneeMm = Math.max(0, p.cavityDepthMm - slopeHeight);
  const apexZ = floorZ + kneeMm + slopeHeight;
  const innerZ = (x: number): number => floorZ + kneeMm + (W / 2 - Math.abs(x)) * tan;
  const outerZ = (x: number): number => innerZ(x) + t / cos;
  const Wo = W + 2 * t;
  const frontY = -D / 2 - t;
  const backY = D / 2 + t;
  return { t, W, D, pitch, tan, floorZ, apexZ, innerZ, outerZ, Wo, frontY, backY, outerApexZ: outerZ(0) };
}

/** How many ventilation slots fit in a row in the back gable below the slopes (at most the number asked for). */
export function ventSlotCount(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number] | 'ventilationSlots'>): number {
  const { apexZ, tan, floorZ } = aFrameFrame(p);
  for (let n = p.ventilationSlots; n > 0; n--) {
    const rowHalf = (n * (SLOT_WIDTH_MM + 8)) / 2;
    if (apexZ - (rowHalf + 4) * tan - SLOT_LENGTH_MM >= floorZ + 20) return n;
  }
  return 0;
}

/** The floor's cleaning opening and plug (unless only the cuts are wanted), or its drainage holes. */
export function aFrameFloor(p: Pick<AFrameParams, (typeof PLUG_KEYS)[number]>, context: BuildContext, withPlug = true) {
  return floorOpening({
    openingDiameterMm: Math.min(p.floorWidthMm, p.floorDepthMm) - 40,
    floorThicknessMm: p.wallThicknessMm,
    floorBottomZMm: 0,
    cleaningAccess: p.cleaningAccess,
    clearanceMm: p.printClearanceMm,
    drainageHoles: p.drainageHoles,
    segments: context.pick(64, 24),
    draft: context.draft,
    withPlug,
  });
}

/** The outside section of the walls and the inside section of the cavity, in (x, z); both counter-clockwise. */
export function aFrameSections(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number]>): {
  bodyOutline: Outline;
  cavityOutline: Outline;
} {
  const { W, floorZ, apexZ, innerZ, outerZ, Wo, outerApexZ } = aFrameFrame(p);
  const bodyOutline: Outline = [
    [-Wo / 2, 0],
    [Wo / 2, 0],
    [Wo / 2, outerZ(Wo / 2)],
    [0, outerApexZ],
    [-Wo / 2, outerZ(Wo / 2)],
  ];
  const cavityOutline: Outline = [
    [-W / 2, floorZ],
    [W / 2, floorZ],
    [W / 2, innerZ(W / 2)],
    [W / 2, innerZ(W / 2)],
    [0, apexZ],
    [-W / 2, innerZ(W / 2)],
  ];
  return { bodyOutline, cavityOutline };
}

/** The ventilation slots in a row in the back gable, as many as fit below the slopes, as outlines in (x, z). */
export function ventSlotOutlines(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number] | 'ventilationSlots'>): Outline[] {
  const { apexZ, tan } = aFrameFrame(p);
  const slots = ventSlotCount(p);
  const rowHalf = (slots * (SLOT_WIDTH_MM + 8)) / 2;
  const topZ = apexZ - (rowHalf + 4) * tan;
  return Array.from({ length: slots }, (_, i) => {
    const x = -rowHalf + (i + 0.5) * (SLOT_WIDTH_MM + 8);
    return slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [
      u + x,
      v + topZ - SLOT_LENGTH_MM / 2,
    ]);
  });
}

/** The crest along the apex that carries the hanging wire's tunnel, in (x, z), and the tunnel's centre height. */
export function crestOutline(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number]>): {
  crest: Outline;
  tunnelZ: number;
  tunnelDiameterMm: number;
} {
  const { tan, outerApexZ } = aFrameFrame(p);
  const crestHalf = HANGING_HOLE_MM + 3;
  const crest: Outline = [
    [-crestHalf, outerApexZ - crestHalf * tan - 1],
    [crestHalf, outerApexZ - crestHalf * tan - 1],
    [crestHalf, outerApexZ + 2],
    [0, outerApexZ + 2 + crestHalf * tan],
    [-crestHalf, outerApexZ + 2],
  ];
  return { crest, tunnelZ: outerApexZ + 1, tunnelDiameterMm: HANGING_HOLE_MM };
}

/** The shingle rows (or, for a draft, one slab per slope) on both slopes. */
export function shingleOptions(
  p: Pick<AFrameParams, (typeof FRAME_KEYS)[number]>,
  slabs: boolean,
): Parameters<typeof shingleRows>[0] {
  const { pitch, outerZ, Wo, frontY, backY } = aFrameFrame(p);
  return {
    fromXMm: SHINGLE_PROUD_MM / Math.sin(pitch) + 1,
    toXMm: Wo / 2,
    outerZ,
    pitchDeg: p.roofPitchDeg,
    fromYMm: frontY,
    toYMm: backY,
    slabs,
  };
}

/** Board grooves cut into the front, each a vertical V-shaped prism. */
export function boardGrooves(p: Pick<AFrameParams, (typeof FRAME_KEYS)[number]>): Solid[] {
  const { apexZ, innerZ, Wo, frontY } = aFrameFrame(p);
  const cuts: Solid[] = [];
  for (let x = -Wo / 2 + 15; x <= Wo / 2 - 15 + 1e-9; x += 15) {
    const groove: Outline = [
      [x - 1.2, frontY - 1],
      [x + 1.2, frontY - 1],
      [x, frontY + 1.2],
    ];
    const top = Math.min(innerZ(Math.abs(x) + 1.2), apexZ) - 1;
    if (top > 10) cuts.push(Solid.prism(groove, 'z', 2, top));
  }
  return cuts;
}

/** The entry's height: parseParams has checked it against the highest allowed, so the hole sits exactly where asked. */
export function entryCentreZ(p: Pick<AFrameParams, 'wallThicknessMm' | 'holeAboveFloorMm' | 'entryHoleDiameterMm'>) {
  return p.wallThicknessMm + p.holeAboveFloorMm + p.entryHoleDiameterMm / 2;
}

/** The perch under the entry: tip down, so its V underside prints without support; it ends 1 mm into the front wall. */
export function perch(p: AFrameParams, context: BuildContext): Solid {
  const { frontY } = aFrameFrame(p);
  const perchZ = entryCentreZ(p) - p.entryHoleDiameterMm / 2 - 18;
  return Solid.prism(
    teardropOutline(10, context.pick(24, 12), false, Math.SQRT2),
    'y',
    frontY - 30,
    frontY + 1,
  ).translate(0, 0, perchZ);
}

/** The landing dowel, reused across moves of other parameters, at the front wall. */
export function placedDowel(p: Pick<AFrameParams, (typeof SHELL_KEYS)[number]>, context: BuildContext): Solid {
  const { frontY } = aFrameFrame(p);
  return context
    .reuse('landing-dowel', p, DOWEL_KEYS, (q) => landingDowel(q.landingDowelLengthMm, context))
    .translate(0, frontY, 0);
}

/**
 * The full build's body less the entry and perch: walls, crest, landing dowel and trim, less cavity, vents and floor
 * opening, joined and cut with 3D booleans (drafts build theirs as one mesh, `aFrameDraft.ts`).
 */
export function aFrameShell(p: Pick<AFrameParams, (typeof SHELL_KEYS)[number]>, context: BuildContext): Solid {
  const { D, frontY, backY } = aFrameFrame(p);
  const { bodyOutline, cavityOutline } = aFrameSections(p);
  const additions: Solid[] = [];
  const cuts: Solid[] = [Solid.prism(cavityOutline, 'y', -D / 2, D / 2)];
  for (const slot of ventSlotOutlines(p)) cuts.push(Solid.prism(slot, 'y', D / 2 - 1, backY + 1));
  if (p.hangingHole) {
    const { crest, tunnelZ, tunnelDiameterMm } = crestOutline(p);
    additions.push(Solid.prism(crest, 'y', frontY, backY));
    cuts.push(Solid.prism(teardropOutline(tunnelDiameterMm, 16), 'y', frontY - 1, backY + 1).translate(0, 0, tunnelZ));
  }
  if (p.landingDowel) additions.push(placedDowel(p, context));
  if (p.trimStyle === 'shingles') additions.push(...shingleRows(shingleOptions(p, false)));
  if (p.trimStyle === 'boards') cuts.push(...boardGrooves(p));
  cuts.push(...aFrameFloor(p, context, false).cuts);
  return Solid.prism(bodyOutline, 'y', frontY, backY)
    .add(...additions)
    .subtract(...cuts);
}
