import { z } from 'zod';
import type { Template } from './types';
import { barkTube, type BarkChamber } from './lib/barkTube';
import { BuildContext } from './lib/BuildContext';
import { commonParameters } from './lib/commonParameters';
import { floorOpening } from './lib/floorOpening';
import { Solid, type Outline } from './lib/Solid';
import { slotAreaMm2, slotOutline, teardropOutline, TEARDROP_TIP_RADII } from './lib/teardrop';
import { partMesh } from './lib/partMesh';
import { backMounting } from './lib/mountingText';

const parameters = z
  .object({
    entryHoleDiameterMm: commonParameters.entryHoleDiameterMm(32),
    holeAboveFloorMm: commonParameters.holeAboveFloorMm(125),
    cavityDiameterMm: z.number().min(90).max(160).default(100).meta({
      label: 'Chamber diameter',
      unit: 'mm',
      step: 1,
      help: 'Inside diameter of each round chamber (its floor).',
    }),
    cavityDepthMm: z.number().min(140).max(260).default(160).meta({
      label: 'Chamber depth',
      unit: 'mm',
      step: 1,
      help: 'Inside floor up to where the pointed ceiling starts; keep the top of the entry below it. The trunk stands about chamber depth + chamber radius + 42 mm tall per storey with the hanging tab.',
    }),
    storeys: z.number().int().min(1).max(2).default(1).meta({
      label: 'Storeys',
      unit: 'count',
      step: 1,
      help: 'One or two chambers stacked, each with its own entry; two storeys are taller than most build volumes.',
    }),
    wallThicknessMm: commonParameters.wallThicknessMm(10),
    barkDepthMm: z.number().min(0).max(3).default(2).meta({
      label: 'Bark depth',
      unit: 'mm',
      step: 0.1,
      help: 'Depth of the bark furrows on the outside; 0 gives a smooth trunk.',
    }),
    barkSeed: z.number().int().min(1).max(999).default(7).meta({
      label: 'Bark pattern',
      unit: 'count',
      step: 1,
      help: 'Pick another number for another bark pattern.',
    }),
    knotRimMm: z.number().min(0).max(10).default(5).meta({
      label: 'Knot rim',
      unit: 'mm',
      step: 0.5,
      help: 'Width of the knot-like rim round each entry (below 1 mm: no rim); it also thickens the wall against enlarging the hole.',
    }),
    mountRadiusMm: z.number().min(50).max(600).default(150).meta({
      label: 'Tree radius',
      unit: 'mm',
      step: 5,
      help: 'Radius of the trunk or pole the concave back sits against.',
    }),
    flatBack: z.boolean().default(false).meta({
      label: 'Flat back',
      unit: '',
      help: 'A flat back for a wall or post instead of the concave one.',
    }),
    ventilationSlots: commonParameters.ventilationSlots(2),
    drainageHoles: commonParameters.drainageHoles(4),
    hangingHole: commonParameters.hangingHole(true),
    perch: commonParameters.perch(),
    cleaningAccess: commonParameters.cleaningAccess(
      'A round plug in the lowest floor, printed as a separate part. An upper storey has no cleaning access.',
    ),
    printClearanceMm: commonParameters.printClearanceMm(),
  })
  .strict();

const SLOT_WIDTH_MM = 6;
const SLOT_LENGTH_MM = 26;
const SEGMENTS = 96;

type BarkParams = z.output<typeof parameters>;

/** Parameters the chamber cavities depend on. */
const CHAMBER_KEYS = ['cavityDiameterMm', 'cavityDepthMm', 'storeys', 'wallThicknessMm'] as const;
/** Parameters the floor opening (and its plug) depend on. */
const PLUG_KEYS = [
  'cavityDiameterMm',
  'wallThicknessMm',
  'cleaningAccess',
  'printClearanceMm',
  'drainageHoles',
] as const;
/**
 * Parameters the bark depends on: the textured trunk with its back, its chambers and its cleaning opening, before
 * any cut.
 */
const BARK_KEYS = [...CHAMBER_KEYS, 'barkDepthMm', 'barkSeed', 'cleaningAccess', 'mountRadiusMm', 'flatBack'] as const;
/** Parameters the cuts (vents, weep holes, drainage holes) depend on: not the bark pattern. */
const CUT_KEYS = [...CHAMBER_KEYS, ...PLUG_KEYS, 'barkDepthMm', 'ventilationSlots'] as const;

/**
 * Bark trunk printed upright: a bark-textured cylinder with one or two stacked chambers (each with a 45° pointed
 * ceiling and its own entry in a knot-like rim), a concave or flat back (+y) and an optional floor plug.
 */
export const barkTrunk: Template<typeof parameters> = {
  id: 'bark-trunk',
  version: 5,
  name: 'Bark trunk',
  summary: 'Bark-textured log with one or two chambers, knot-rimmed entries and a back shaped to its tree.',
  parameters,
  inUse: 'as-built',
  mounting: (p, widthMm) => backMounting(p.flatBack ? null : p, widthMm),
  limits(p) {
    return {
      holeAboveFloorMm: {
        maxMm: barkMaxHoleAboveFloorMm(p),
        because: `for a ${p.cavityDepthMm} mm cavity of ${p.cavityDiameterMm} mm diameter with this entry and rim (the hole stays under the pointed ceiling)`,
      },
    };
  },
  build(p, context = new BuildContext('full')) {
    const t = p.wallThicknessMm;
    const Ri = p.cavityDiameterMm / 2;
    // 2 mm of solid beyond the wall, so the back cut always crosses the outside at an angle (a tangent cut leaves
    // slivers) and the furrows never thin the wall.
    const Ro = Ri + t + 2 + p.barkDepthMm;
    const storeyMm = p.cavityDepthMm + Ri + t;
    const r = p.entryHoleDiameterMm / 2;
    const frontY = -Ro;
    const holeSegments = context.pick(48, 16);

    // The bark (a mesh built here with its back and chambers, the costliest solid to make) depends only on the
    // trunk's size, texture and back, the cuts (vents, weep and drainage holes) not on the bark pattern; a slider on
    // the entries, their rims or the perch reuses both. Everything is then added in one union and cut in one
    // subtraction, because each kernel operation costs about as much as the whole mesh it works on.
    const bark = context.reuse('bark', p, BARK_KEYS, (q) => trunkBark(q, context));
    const cuts = context.reuse('cuts', p, CUT_KEYS, (q) => trunkCuts(q, context));

    const features: Solid[] = p.hangingHole ? [hangingTab(p, context)] : [];
    // Rims and perches reach into the chamber so they join the wall whatever its thickness.
    const inChamber: Solid[] = [];
    const holes: Solid[] = [];
    for (let storey = 0; storey < p.storeys; storey++) {
      // parseParams has checked the entry against barkMaxHoleAboveFloorMm, so each hole sits exactly where asked.
      const holeCentreZ = t + storey * storeyMm + p.holeAboveFloorMm + r;
      holes.push(
        Solid.prism(teardropOutline(p.entryHoleDiameterMm, holeSegments), 'y', frontY - 12, -Ri + 1).translate(
          0,
          0,
          holeCentreZ,
        ),
      );
      // Under 1 mm the rim would only graze the hole's own outline (zero-volume slivers), so it is left off.
      if (p.knotRimMm >= 1) {
        // Tip-down outline: the rim's underside is a 45° V, so it prints without support.
        const rim = teardropOutline(p.entryHoleDiameterMm + 2 * p.knotRimMm, holeSegments, false, Math.SQRT2);
        inChamber.push(Solid.prism(rim, 'y', frontY - 6, 0).translate(0, 0, holeCentreZ));
      }
      if (p.perch) {
        inChamber.push(
          Solid.prism(
            teardropOutline(10, context.pick(24, 12), false, Math.SQRT2),
            'y',
            frontY - 30,
            -Ri / 2,
          ).translate(0, 0, holeCentreZ - r - p.knotRimMm - 16),
        );
      }
    }
    // The bark has its chambers already, so rims and perches are trimmed on their own (a small operation) by the
    // chambers grown by 1 mm: the margin lies in solid wall, so the union fills nothing the chambers would keep open,
    // and no face of theirs lies on the chambers' own surface.
    if (inChamber.length > 0) {
      const trim = context.reuse('chamber-trim', p, CHAMBER_KEYS, (q) => grownChambers(q, context, 1));
      features.push(Solid.union(inChamber).subtract(trim));
    }
    const body = bark.add(...features).subtract(cuts, ...holes);

    const openingMm = p.cavityDiameterMm - 30;
    const plug = p.cleaningAccess
      ? context.reuse('floor-plug', p, PLUG_KEYS, (q) => bodyFloor(q, context).plug!)
      : undefined;
    const parts = [{ name: 'body', mesh: partMesh(body) }];
    if (plug) parts.push({ name: 'floor-plug', mesh: partMesh(plug.translate(Ro + 10 + openingMm / 2 + 8, 0, 0)) });
    return {
      parts,
      facts: {
        entryHoleDiameterMm: p.entryHoleDiameterMm,
        floorWidthMm: p.cavityDiameterMm,
        floorDepthMm: p.cavityDiameterMm,
        cavityDepthMm: p.cavityDepthMm,
        holeAboveFloorMm: p.holeAboveFloorMm,
        wallThicknessMm: t,
        hasPerch: p.perch,
        drainageHoleCount: p.storeys > 1 ? Math.min(p.drainageHoles, 3) : p.drainageHoles,
        ventilationAreaMm2: 2 * p.ventilationSlots * slotAreaMm2(SLOT_WIDTH_MM, SLOT_LENGTH_MM),
        cleaningAccess: p.cleaningAccess && p.storeys === 1,
        chambers: p.storeys,
      },
    };
  },
};

/**
 * Highest the entry's bottom edge may sit above a chamber's floor: the hole, its rim allowance (r + 4) and 3 mm of
 * wall stay under the chamber's 45° pointed ceiling.
 */
function barkMaxHoleAboveFloorMm(p: z.output<typeof parameters>): number {
  const Ri = p.cavityDiameterMm / 2;
  const r = p.entryHoleDiameterMm / 2;
  return p.cavityDepthMm + Ri - (r + 4) - TEARDROP_TIP_RADII * r - 3 - r;
}

/** The stacked chambers, each a cylinder of the cavity's radius from its floor up to a 45° pointed ceiling. */
function chambers(p: Pick<BarkParams, (typeof CHAMBER_KEYS)[number]>, context: BuildContext): BarkChamber[] {
  const t = p.wallThicknessMm;
  const Ri = p.cavityDiameterMm / 2;
  const storeyMm = p.cavityDepthMm + Ri + t;
  return Array.from({ length: p.storeys }, (_, storey) => {
    const floorZMm = t + storey * storeyMm;
    return { radiusMm: Ri, floorZMm, ceilingZMm: floorZMm + p.cavityDepthMm, segments: context.pick(SEGMENTS, 24) };
  });
}

/** The chambers grown by `marginMm` all round (walls, floor and the 45° ceiling offset along its normal), as one solid. */
function grownChambers(
  p: Pick<BarkParams, (typeof CHAMBER_KEYS)[number]>,
  context: BuildContext,
  marginMm: number,
): Solid {
  return Solid.union(
    chambers(p, context).map(({ radiusMm, floorZMm, ceilingZMm, segments }) => {
      const r = radiusMm + marginMm;
      const apexZ = ceilingZMm + radiusMm + Math.SQRT2 * marginMm;
      const outline: Outline = [
        [0, floorZMm - marginMm],
        [r, floorZMm - marginMm],
        [r, apexZ - r],
        [0, apexZ],
      ];
      return Solid.revolve(outline, segments);
    }),
  );
}

/** The lowest floor's cleaning opening and plug, or its drainage holes. */
function bodyFloor(p: Pick<BarkParams, (typeof PLUG_KEYS)[number]>, context: BuildContext) {
  return floorOpening({
    openingDiameterMm: p.cavityDiameterMm - 30,
    floorThicknessMm: p.wallThicknessMm,
    floorBottomZMm: 0,
    cleaningAccess: p.cleaningAccess,
    clearanceMm: p.printClearanceMm,
    drainageHoles: p.drainageHoles,
    segments: context.pick(64, 16),
  });
}

/** The trunk's outside radius and height (the ridges of the bark; the back is cut later). */
function trunkSize(
  p: Pick<BarkParams, 'cavityDiameterMm' | 'cavityDepthMm' | 'storeys' | 'wallThicknessMm' | 'barkDepthMm'>,
) {
  const t = p.wallThicknessMm;
  const Ri = p.cavityDiameterMm / 2;
  const Ro = Ri + t + 2 + p.barkDepthMm;
  const storeyMm = p.cavityDepthMm + Ri + t;
  return { t, Ri, Ro, storeyMm, heightMm: t + storeyMm * p.storeys };
}

/**
 * The bark-textured trunk with its back, its chambers and its cleaning opening, before every other cut. The back is
 * a tree of the given radius touching the chamber wall's outside, or a plane there.
 */
function trunkBark(p: Pick<BarkParams, (typeof BARK_KEYS)[number]>, context: BuildContext): Solid {
  const { t, Ri, Ro, heightMm } = trunkSize(p);
  return barkTube({
    radiusMm: Ro,
    heightMm,
    barkDepthMm: p.barkDepthMm,
    seed: p.barkSeed,
    // 160 × 4 mm rows: the furrows stay crisp at about 40 % fewer triangles than 192 × 3 mm (measured). The draft
    // keeps the pattern's shape at a coarser grid (48 × 14 mm: about a quarter less build time than 64 × 10 mm).
    segments: context.pick(160, 48),
    rowMm: context.pick(4, 14),
    // The cleaning opening through the lowest floor into the chamber, with the plug's segments.
    bottomHole: p.cleaningAccess
      ? { radiusMm: (p.cavityDiameterMm - 30) / 2, depthMm: t, segments: context.pick(64, 16) }
      : undefined,
    back: { yMm: Ri + t, treeRadiusMm: p.flatBack ? undefined : p.mountRadiusMm },
    chambers: chambers(p, context),
  });
}

/** The hanging tab on top, with its eye, sunk 4 mm into the trunk's top. */
function hangingTab(p: BarkParams, context: BuildContext): Solid {
  const { t, Ri, heightMm } = trunkSize(p);
  const tab = Solid.box([28, 8, 26], [-14, Ri + t / 2 - 8, heightMm - 4]);
  const eye = Solid.prism(teardropOutline(8, context.pick(24, 12)), 'y', Ri - 10, Ri + t + 4).translate(
    0,
    0,
    heightMm + 9,
  );
  return tab.subtract(eye);
}

/** Everything cut from the trunk but the entries: the ventilation slots, weep holes and drainage holes, as one solid. */
function trunkCuts(p: Pick<BarkParams, (typeof CUT_KEYS)[number]>, context: BuildContext): Solid {
  const { t, Ri, Ro, storeyMm } = trunkSize(p);
  const frontY = -Ro;
  const cuts: Solid[] = [];
  for (let storey = 0; storey < p.storeys; storey++) {
    const floorZ = t + storey * storeyMm;
    const ceilingZ = floorZ + p.cavityDepthMm;
    const slotZ = ceilingZ - SLOT_LENGTH_MM / 2 - 4;
    for (let i = 0; i < p.ventilationSlots; i++) {
      const y = (i - (p.ventilationSlots - 1) / 2) * (SLOT_WIDTH_MM + 8);
      const slot = slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [u + y, v + slotZ]);
      cuts.push(Solid.prism(slot, 'x', Ri * 0.5, Ro + 2), Solid.prism(slot, 'x', -Ro - 2, -Ri * 0.5));
    }
    if (storey > 0) {
      // An upper floor drains forward through weep holes at floor level (vertical holes would open into the
      // chamber below).
      const weeps = Math.min(p.drainageHoles, 3);
      for (let i = 0; i < weeps; i++) {
        const x = (i - (weeps - 1) / 2) * 16;
        cuts.push(
          Solid.prism(teardropOutline(6, context.pick(16, 8)), 'y', frontY - 12, -Ri + 2).translate(x, 0, floorZ + 3),
        );
      }
    }
  }
  // The cleaning opening is in the bark's mesh; drainage holes are cut.
  if (!p.cleaningAccess) cuts.push(...bodyFloor(p, context).cuts);
  return Solid.union(cuts);
}
