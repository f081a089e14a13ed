import { z } from 'zod';
import type { Template } from './types';
import { commonParameters } from './lib/commonParameters';
import { eggCeilingZ, eggProfile } from './lib/eggProfile';
import { floorOpening } from './lib/floorOpening';
import { Solid } from './lib/Solid';
import { slotAreaMm2, slotOutline, teardropOutline, TEARDROP_TIP_RADII } from './lib/teardrop';
import { toGeom3 } from './lib/toGeom3';

const parameters = z
  .object({
    entryHoleDiameterMm: commonParameters.entryHoleDiameterMm(32),
    holeAboveFloorMm: commonParameters.holeAboveFloorMm(130),
    bodyDiameterMm: z.number().min(150).max(240).default(180).meta({
      label: 'Body diameter',
      unit: 'mm',
      step: 1,
      help: 'Widest outside diameter of the pod.',
    }),
    bodyHeightMm: z.number().min(200).max(320).default(228).meta({
      label: 'Body height',
      unit: 'mm',
      step: 1,
      help: 'Outside height from the flat printing face to the top (the hanging eye adds 18 mm); taller than wide makes an egg.',
    }),
    floorDiameterMm: z.number().min(80).max(150).default(110).meta({
      label: 'Floor diameter',
      unit: 'mm',
      step: 1,
      help: 'Inside floor diameter; it is reduced when the body is too narrow for it.',
    }),
    wallThicknessMm: commonParameters.wallThicknessMm(10),
    ventilationSlots: commonParameters.ventilationSlots(2),
    drainageHoles: commonParameters.drainageHoles(4),
    hangingHole: z.boolean().default(true).meta({
      label: 'Hanging eye',
      unit: '',
      help: 'A tab with a hole on top to hang the pod by wire; hang it out of reach of predators and follow local guidance on height.',
    }),
    perch: commonParameters.perch(),
    cleaningAccess: commonParameters.cleaningAccess(),
    printClearanceMm: commonParameters.printClearanceMm(),
  })
  .strict();

const SEGMENTS = 64;
const PROFILE_STEPS = 16;
const SLOT_WIDTH_MM = 6;
const SLOT_LENGTH_MM = 26;

/**
 * Round pod printed upright on a flat face: an egg whose underside flattens into a 45° cone and whose inside
 * ceiling rises to a 45° point, so neither needs support. Entry faces −y, hanging eye on top.
 */
export const roundPod: Template<typeof parameters> = {
  id: 'round-pod',
  version: 2,
  name: 'Round pod',
  summary: 'Egg-shaped pod on a flat printing face, with a hanging eye and an optional floor plug.',
  parameters,
  limits(p) {
    return {
      holeAboveFloorMm: {
        maxMm: podFrame(p).maxHoleAboveFloorMm,
        because: `for a ${p.bodyDiameterMm} × ${p.bodyHeightMm} mm body with this wall and entry (the hole stays 4 mm under the ceiling)`,
      },
    };
  },
  build(p) {
    const { t, a, lower, ai, bli, floorRadius, floorZ, cutZ, apexZ, upper, upperInner, ceiling } = podFrame(p);

    const outer = Solid.revolve(
      eggProfile({
        radiusMm: a,
        upperMm: upper,
        lowerMm: lower,
        cutZMm: cutZ,
        steps: PROFILE_STEPS,
        coneTop: true,
        coneBottom: true,
      }),
      SEGMENTS,
    );
    const cavity = Solid.revolve(
      eggProfile({
        radiusMm: ai,
        upperMm: upperInner,
        lowerMm: bli,
        cutZMm: floorZ,
        steps: PROFILE_STEPS,
        coneTop: true,
        coneBottom: false,
      }),
      SEGMENTS,
    );
    const additions: Solid[] = [];
    const cuts: Solid[] = [cavity];

    const r = p.entryHoleDiameterMm / 2;
    // parseParams has checked the entry against podFrame's limit, so the hole sits exactly where asked.
    const holeCentreZ = floorZ + p.holeAboveFloorMm + r;
    cuts.push(
      Solid.prism(teardropOutline(p.entryHoleDiameterMm, 48), 'y', -a - 2, -ai * 0.3).translate(0, 0, holeCentreZ),
    );

    const slotZ = Math.min(upperInner * 0.55, ceiling(ai * 0.75) - SLOT_LENGTH_MM);
    for (let i = 0; i < p.ventilationSlots; i++) {
      const y = (i - (p.ventilationSlots - 1) / 2) * (SLOT_WIDTH_MM + 8);
      const slot = slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [u + y, v + slotZ]);
      cuts.push(Solid.prism(slot, 'x', ai * 0.5, a + 2), Solid.prism(slot, 'x', -a - 2, -ai * 0.5));
    }

    if (p.hangingHole) {
      const tab = Solid.box([28, 8, 38], [-14, -4, apexZ - 20]);
      const eye = Solid.prism(teardropOutline(8, 24), 'y', -5, 5).translate(0, 0, apexZ + 8);
      additions.push(tab.subtract(eye));
    }

    if (p.perch) {
      const perchZ = holeCentreZ - r - 18;
      const wallY = -Math.sqrt(Math.max(0, 1 - (perchZ / (perchZ >= 0 ? upper : lower)) ** 2)) * a + 2;
      additions.push(
        Solid.prism(teardropOutline(10, 24, false, Math.SQRT2), 'y', wallY - 30, wallY + t).translate(0, 0, perchZ),
      );
    }

    const openingMm = floorRadius * 2 - 30;
    const floor = floorOpening({
      openingDiameterMm: openingMm,
      floorThicknessMm: t,
      floorBottomZMm: cutZ,
      cleaningAccess: p.cleaningAccess,
      clearanceMm: p.printClearanceMm,
      drainageHoles: p.drainageHoles,
    });
    cuts.push(...floor.cuts);
    const plug = floor.plug;

    const body = outer
      .add(...additions)
      .subtract(...cuts)
      .translate(0, 0, -cutZ);
    const parts = [{ name: 'body', geometry: toGeom3(body) }];
    if (plug) parts.push({ name: 'floor-plug', geometry: toGeom3(plug.translate(a + 10 + openingMm / 2 + 8, 0, 0)) });
    return {
      parts,
      facts: {
        entryHoleDiameterMm: p.entryHoleDiameterMm,
        floorWidthMm: floorRadius * 2,
        floorDepthMm: floorRadius * 2,
        cavityDepthMm: ceiling(0) - floorZ,
        holeAboveFloorMm: p.holeAboveFloorMm,
        wallThicknessMm: t,
        hasPerch: p.perch,
        drainageHoleCount: p.drainageHoles,
        ventilationAreaMm2: 2 * p.ventilationSlots * slotAreaMm2(SLOT_WIDTH_MM, SLOT_LENGTH_MM),
        cleaningAccess: p.cleaningAccess,
        chambers: 1,
      },
    };
  },
};

/**
 * The pod's shape from the parameters (model coordinates, equator at z = 0): outside and inside radii, the inside
 * floor and printing-face heights, the cone apex, the egg's upper half-heights, the inside ceiling, and the highest
 * the entry's bottom edge may sit above the floor (the teardrop tip 4 mm under the ceiling).
 */
function podFrame(p: z.output<typeof parameters>) {
  const t = p.wallThicknessMm;
  const a = p.bodyDiameterMm / 2;
  const lower = a;
  const ai = a - t;
  const bli = lower - t;
  const floorRadius = Math.min(p.floorDiameterMm / 2, ai - 15);
  // Inside floor height below the equator, then the flat printing face one floor thickness lower.
  const floorZ = -bli * Math.sqrt(1 - (floorRadius / ai) ** 2);
  const cutZ = floorZ - t;
  // Both tops are 45° cones over the ellipses (apex at √(a² + b²)); the inner apex sits t·√2 lower so the cone wall
  // keeps the full wall thickness.
  const apexZ = Math.max(a * 1.25, p.bodyHeightMm + cutZ);
  const upper = Math.sqrt(apexZ ** 2 - a ** 2);
  const upperInner = Math.sqrt((apexZ - t * Math.SQRT2) ** 2 - ai ** 2);
  const ceiling = (x: number): number => eggCeilingZ({ radiusMm: ai, upperMm: upperInner }, x);
  const r = p.entryHoleDiameterMm / 2;
  const highestCentreZ = ceiling(r + 6) - TEARDROP_TIP_RADII * r - 4;
  const maxHoleAboveFloorMm = highestCentreZ - r - floorZ;
  return { t, a, lower, ai, bli, floorRadius, floorZ, cutZ, apexZ, upper, upperInner, ceiling, maxHoleAboveFloorMm };
}
