import { z } from 'zod';
import type { Template } from './types';
import { commonParameters } from './lib/commonParameters';
import { floorOpening } from './lib/floorOpening';
import { shingleRows, SHINGLE_PROUD_MM } from './lib/shingleRows';
import { Solid, type Outline } from './lib/Solid';
import { slotAreaMm2, slotOutline, teardropOutline } from './lib/teardrop';
import { toGeom3 } from './lib/toGeom3';

const parameters = z
  .object({
    entryHoleDiameterMm: commonParameters.entryHoleDiameterMm(32),
    holeAboveFloorMm: commonParameters.holeAboveFloorMm(130),
    floorWidthMm: z.number().min(90).max(200).default(130).meta({
      label: 'Floor width',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, side to side (where the sloped walls stand).',
    }),
    floorDepthMm: z.number().min(80).max(200).default(120).meta({
      label: 'Floor depth',
      unit: 'mm',
      step: 1,
      help: 'Inside floor, front to back.',
    }),
    cavityDepthMm: z.number().min(150).max(320).default(200).meta({
      label: 'Inside height',
      unit: 'mm',
      step: 1,
      help: 'Inside floor up to the apex; short upright walls are added under the slopes when the slopes alone are too low.',
    }),
    wallThicknessMm: commonParameters.wallThicknessMm(10),
    roofPitchDeg: z.number().min(55).max(75).default(60).meta({
      label: 'Wall slope',
      unit: 'deg',
      step: 1,
      help: 'Slope of the A-frame walls from horizontal; 55° or steeper keeps their inside faces self-supporting.',
    }),
    landingDowel: z.boolean().default(true).meta({
      label: 'Landing dowel',
      unit: '',
      help: 'A flat-bottomed dowel with a rounded end at the foot of the front, printed with the first layers. It sits far below the entry; leave it off where predators are a concern.',
    }),
    landingDowelLengthMm: z.number().min(20).max(80).default(45).meta({
      label: 'Landing dowel length',
      unit: 'mm',
      step: 1,
      help: 'How far the landing dowel reaches in front of the box.',
    }),
    trimStyle: z.enum(['none', 'shingles', 'boards']).default('shingles').meta({
      label: 'Trim',
      unit: '',
      help: 'Shingle rows on the slopes or board grooves on the front; both print without support.',
    }),
    ventilationSlots: z.number().int().min(0).max(6).default(3).meta({
      label: 'Ventilation slots',
      unit: 'count',
      step: 1,
      help: 'Slots with pointed ends in the back gable; fewer are cut when the gable is too narrow for all of them.',
    }),
    drainageHoles: commonParameters.drainageHoles(4),
    hangingHole: commonParameters.hangingHole(true),
    perch: commonParameters.perch(),
    cleaningAccess: commonParameters.cleaningAccess(),
    printClearanceMm: commonParameters.printClearanceMm(),
  })
  .strict();

const SLOT_WIDTH_MM = 6;
const SLOT_LENGTH_MM = 30;
const HANGING_HOLE_MM = 5;
const HOLE_SEGMENTS = 48;

/**
 * A-frame printed floor-down: two steep sloped walls (with short upright walls under them when needed), a flat
 * landing dowel lying on the build plate, and an optional round floor plug. Entry faces −y.
 */
export const aFrame: Template<typeof parameters> = {
  id: 'a-frame',
  version: 2,
  name: 'A-frame',
  summary: 'Steep A-frame printed floor-down, with a landing dowel that prints with the first layers.',
  parameters,
  limits(p) {
    return {
      holeAboveFloorMm: {
        maxMm: aFrameMaxHoleAboveFloorMm(p),
        because: `for a ${p.cavityDepthMm} mm cavity with this floor width, roof pitch and entry (a 3 mm rim stays between the hole and the roof)`,
      },
    };
  },
  build(p) {
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
    const outerApexZ = outerZ(0);

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
      [0, apexZ],
      [-W / 2, innerZ(W / 2)],
    ];
    const additions: Solid[] = [];
    const cuts: Solid[] = [Solid.prism(cavityOutline, 'y', -D / 2, D / 2)];

    // Entry: keep a 3 mm rim between the hole and the sloped walls.
    const r = p.entryHoleDiameterMm / 2;
    // parseParams has checked the entry against aFrameMaxHoleAboveFloorMm, so the hole sits exactly where asked.
    const holeCentreZ = floorZ + p.holeAboveFloorMm + r;
    const holeAboveFloorMm = p.holeAboveFloorMm;
    cuts.push(
      Solid.prism(teardropOutline(p.entryHoleDiameterMm, HOLE_SEGMENTS), 'y', frontY - 1, -D / 2 + 1).translate(
        0,
        0,
        holeCentreZ,
      ),
    );

    // Ventilation slots in a row in the back gable, as many as fit below the slopes.
    let slots = 0;
    for (let n = p.ventilationSlots; n > 0; n--) {
      const rowHalf = (n * (SLOT_WIDTH_MM + 8)) / 2;
      const topZ = apexZ - (rowHalf + 4) * tan;
      if (topZ - SLOT_LENGTH_MM >= floorZ + 20) {
        slots = n;
        for (let i = 0; i < n; i++) {
          const x = -rowHalf + (i + 0.5) * (SLOT_WIDTH_MM + 8);
          const slot = slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [
            u + x,
            v + topZ - SLOT_LENGTH_MM / 2,
          ]);
          cuts.push(Solid.prism(slot, 'y', D / 2 - 1, backY + 1));
        }
        break;
      }
    }

    if (p.hangingHole) {
      // A crest along the apex carries a wire tunnel front to back.
      const crestHalf = HANGING_HOLE_MM + 3;
      const crest: Outline = [
        [-crestHalf, outerApexZ - crestHalf * tan - 1],
        [crestHalf, outerApexZ - crestHalf * tan - 1],
        [crestHalf, outerApexZ + 2],
        [0, outerApexZ + 2 + crestHalf * tan],
        [-crestHalf, outerApexZ + 2],
      ];
      additions.push(Solid.prism(crest, 'y', frontY, backY));
      cuts.push(
        Solid.prism(teardropOutline(HANGING_HOLE_MM, 16), 'y', frontY - 1, backY + 1).translate(0, 0, outerApexZ + 1),
      );
    }

    if (p.landingDowel) additions.push(landingDowel(frontY, p.landingDowelLengthMm));

    if (p.perch) {
      // Tip down: the dowel's V underside prints without support.
      const perchZ = holeCentreZ - r - 18;
      additions.push(
        Solid.prism(teardropOutline(10, 24, false, Math.SQRT2), 'y', frontY - 30, frontY + 1).translate(0, 0, perchZ),
      );
    }

    if (p.trimStyle === 'shingles') {
      additions.push(
        ...shingleRows({
          fromXMm: SHINGLE_PROUD_MM / Math.sin(pitch) + 1,
          toXMm: Wo / 2,
          outerZ,
          pitchDeg: p.roofPitchDeg,
          fromYMm: frontY,
          toYMm: backY,
        }),
      );
    }
    if (p.trimStyle === 'boards') {
      for (let x = -Wo / 2 + 15; x <= Wo / 2 - 15 + 1e-9; x += 15) {
        const groove: Outline = [
          [x - 1.2, frontY - 1],
          [x + 1.2, frontY - 1],
          [x, frontY + 1.2],
        ];
        const top = Math.min(innerZ(Math.abs(x) + 1.2), apexZ) - 1;
        if (top > 10) cuts.push(Solid.prism(groove, 'z', 2, top));
      }
    }

    const plugDiameterMm = Math.min(W, D) - 40;
    const floor = floorOpening({
      openingDiameterMm: plugDiameterMm,
      floorThicknessMm: floorZ,
      floorBottomZMm: 0,
      cleaningAccess: p.cleaningAccess,
      clearanceMm: p.printClearanceMm,
      drainageHoles: p.drainageHoles,
    });
    cuts.push(...floor.cuts);
    const plug = floor.plug?.translate(Wo / 2 + 10 + plugDiameterMm / 2 + 8, 0, 0);

    const body = Solid.prism(bodyOutline, 'y', frontY, backY)
      .add(...additions)
      .subtract(...cuts);
    const parts = [{ name: 'body', geometry: toGeom3(body) }];
    if (plug) parts.push({ name: 'floor-plug', geometry: toGeom3(plug) });
    return {
      parts,
      facts: {
        entryHoleDiameterMm: p.entryHoleDiameterMm,
        floorWidthMm: W,
        floorDepthMm: D,
        cavityDepthMm: apexZ - floorZ,
        holeAboveFloorMm,
        wallThicknessMm: t,
        hasPerch: p.perch,
        drainageHoleCount: p.drainageHoles,
        ventilationAreaMm2: slots * slotAreaMm2(SLOT_WIDTH_MM, SLOT_LENGTH_MM),
        cleaningAccess: p.cleaningAccess,
        chambers: 1,
      },
    };
  },
};

/**
 * Landing dowel: a half-round bar lying flat on the build plate with a domed end, so every face points up or
 * sideways and it prints with the first layers.
 */
function landingDowel(frontY: number, lengthMm: number): Solid {
  const radius = 7;
  const halfRound: Outline = [];
  for (let i = 0; i <= 16; i++) {
    const angle = (Math.PI * i) / 16;
    halfRound.push([radius * Math.cos(angle), radius * Math.sin(angle)]);
  }
  const bar = Solid.prism(halfRound, 'y', frontY - lengthMm, frontY + 1);
  const quarter: Outline = [[0, 0]];
  for (let i = 0; i <= 8; i++) {
    const angle = (Math.PI / 2) * (i / 8);
    quarter.push([i === 8 ? 0 : radius * Math.cos(angle), radius * Math.sin(angle)]);
  }
  const dome = Solid.revolve(quarter, 32).translate(0, frontY - lengthMm, 0);
  return bar.add(dome);
}

/**
 * Highest the entry's bottom edge may sit above the floor: the hole's centre stays (r + 3) / cos below the apex so a
 * 3 mm rim remains between the hole and the sloped walls.
 */
function aFrameMaxHoleAboveFloorMm(p: z.output<typeof parameters>): number {
  const pitch = (p.roofPitchDeg * Math.PI) / 180;
  const slopeHeight = (p.floorWidthMm / 2) * Math.tan(pitch);
  const kneeMm = Math.max(0, p.cavityDepthMm - slopeHeight);
  const r = p.entryHoleDiameterMm / 2;
  return kneeMm + slopeHeight - (r + 3) / Math.cos(pitch) - r;
}
