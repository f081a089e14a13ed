import { z } from 'zod';
import type { Template } from './types';
import { commonParameters } from './lib/commonParameters';
import { eggCeilingZ, eggProfile } from './lib/eggProfile';
import { floorOpening } from './lib/floorOpening';
import { BuildContext } from './lib/BuildContext';
import { partMesh } from './lib/partMesh';
import { Solid, type Outline } from './lib/Solid';
import { joinRevolvedBand } from './lib/revolvedBand';
import { standPost } from './lib/standPost';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { slotAreaMm2, slotOutline, teardropOutline, TEARDROP_TIP_RADII } from './lib/teardrop';

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

type PodParams = z.output<typeof parameters>;

/** Parameters the cavity depends on. */
const CAVITY_KEYS = ['bodyDiameterMm', 'bodyHeightMm', 'floorDiameterMm', 'wallThicknessMm'] as const;
/** Parameters the egg's wall with its cleaning opening depends on. */
const WALL_KEYS = [...CAVITY_KEYS, 'cleaningAccess'] as const;
/** Parameters the wall above the lowest cut depends on (not the entry's diameter: its bottom edge stays put). */
const BAND_KEYS = [...WALL_KEYS, 'holeAboveFloorMm', 'perch'] as const;
/** Parameters the floor plug depends on. */
const PLUG_KEYS = [...CAVITY_KEYS, 'drainageHoles', 'cleaningAccess', 'printClearanceMm'] as const;
const SLOT_WIDTH_MM = 6;
const SLOT_LENGTH_MM = 26;

/**
 * Round pod printed upright on a flat face: an egg whose underside flattens into a 45° cone and whose inside
 * ceiling rises to a 45° point, so neither needs support. Entry faces −y, hanging eye on top.
 */
export const roundPod: Template<typeof parameters> = {
  id: 'round-pod',
  version: 5,
  name: 'Round pod',
  summary: 'Egg-shaped pod on a flat printing face, with a hanging eye and an optional floor plug.',
  parameters,
  inUse: 'as-built',
  mounting: (p) =>
    p.hangingHole
      ? 'No back to fit: the pod hangs by wire from its eye; hang it out of reach of predators.'
      : 'No back to fit and no hanging eye: hold the pod with a bracket of your own.',
  limits(p) {
    return {
      holeAboveFloorMm: {
        maxMm: podFrame(p).maxHoleAboveFloorMm,
        because: `for a ${p.bodyDiameterMm} × ${p.bodyHeightMm} mm body with this wall and entry (the hole stays 4 mm under the ceiling)`,
      },
    };
  },
  build(p, context = new BuildContext('full')) {
    const { t, a, lower, ai, floorRadius, floorZ, cutZ, upper, ceiling } = podFrame(p);

    const r = p.entryHoleDiameterMm / 2;
    // parseParams has checked the entry against podFrame's limit, so the hole sits exactly where asked.
    const holeCentreZ = floorZ + p.holeAboveFloorMm + r;
    const hole = Solid.prism(
      teardropOutline(p.entryHoleDiameterMm, context.pick(48, 16)),
      'y',
      -a - 2,
      -ai * 0.3,
    ).translate(0, 0, holeCentreZ);
    let perch: Solid | undefined;
    if (p.perch) {
      const perchZ = holeCentreZ - r - 18;
      const wallY = -Math.sqrt(Math.max(0, 1 - (perchZ / (perchZ >= 0 ? upper : lower)) ** 2)) * a + 2;
      // The perch's inner end is trimmed by the cavity before it joins the wall, by a cavity 0.01 % larger: its end
      // then lies a few hundredths of a millimetre inside the wall (the same solid once joined) rather than on the
      // wall's inside faces, where the kernel can leave a zero-volume sliver.
      perch = Solid.prism(teardropOutline(10, context.pick(24, 12), false, Math.SQRT2), 'y', wallY - 30, wallY + t)
        .translate(0, 0, perchZ)
        .subtract(context.reuse('cavity', p, CAVITY_KEYS, (q) => podCavity(q, context)).scale(1.0001, 1.0001, 1.0001));
    }
    // Everything is cut from the wall in one subtraction, because each kernel operation costs about as much as the
    // whole mesh it works on. For the same reason the wall below the lowest cut never goes to the kernel (it is
    // built in JS and welded on), and the hanging tab is joined to the finished mesh without the kernel.
    const cut = (wall: Solid): Solid =>
      (perch ? wall.add(perch) : wall).subtract(...podCuts(p, context), hole).translate(0, 0, -cutZ);
    const segments = context.pick(SEGMENTS, 16);
    const band = podBand(p, context);
    let mesh: IndexedMesh | null = null;
    if (band) {
      const above = context.reuse('wall-above', p, BAND_KEYS, (q) =>
        Solid.revolve(podBand(q, context)!.above, segments),
      );
      mesh = joinRevolvedBand(partMesh(cut(above)), band.below, band.seamEdge, segments, -cutZ);
    }
    // The whole wall, when the band cannot be split off (drainage holes in the floor) or the weld fails.
    const whole = (): Solid =>
      cut(context.reuse('wall', p, WALL_KEYS, (q) => Solid.revolve(podRing(q, context), segments)));
    mesh ??= partMesh(whole());
    if (p.hangingHole) mesh = podWithTab(p, mesh, whole, context);

    const openingMm = floorRadius * 2 - 30;
    const plug = p.cleaningAccess
      ? context.reuse('floor-plug', p, PLUG_KEYS, (q) => podFloor(q, context).plug!)
      : undefined;
    const parts = [{ name: 'body', mesh }];
    if (plug) parts.push({ name: 'floor-plug', mesh: partMesh(plug.translate(a + 10 + openingMm / 2 + 8, 0, 0)) });
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
function podFrame(p: Pick<PodParams, (typeof CAVITY_KEYS)[number]> & Partial<Pick<PodParams, 'entryHoleDiameterMm'>>) {
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
  const r = (p.entryHoleDiameterMm ?? 0) / 2;
  const highestCentreZ = ceiling(r + 6) - TEARDROP_TIP_RADII * r - 4;
  const maxHoleAboveFloorMm = highestCentreZ - r - floorZ;
  return { t, a, lower, ai, bli, floorRadius, floorZ, cutZ, apexZ, upper, upperInner, ceiling, maxHoleAboveFloorMm };
}

/** The inside of the egg: an egg of the inner radii, flat on the inside floor, with a 45° pointed ceiling. */
function podCavity(p: Pick<PodParams, (typeof CAVITY_KEYS)[number]>, context: BuildContext): Solid {
  const { ai, bli, floorZ, upperInner } = podFrame(p);
  return Solid.revolve(
    eggProfile({
      radiusMm: ai,
      upperMm: upperInner,
      lowerMm: bli,
      cutZMm: floorZ,
      steps: context.pick(PROFILE_STEPS, 4),
      coneTop: true,
      coneBottom: false,
    }),
    context.pick(SEGMENTS, 16),
  );
}

/** The floor's cleaning opening and plug, or its drainage holes (model coordinates, like the wall). */
function podFloor(p: Pick<PodParams, (typeof PLUG_KEYS)[number]>, context: BuildContext) {
  const { t, floorRadius, cutZ } = podFrame(p);
  return floorOpening({
    openingDiameterMm: floorRadius * 2 - 30,
    floorThicknessMm: t,
    floorBottomZMm: cutZ,
    cleaningAccess: p.cleaningAccess,
    clearanceMm: p.printClearanceMm,
    drainageHoles: p.drainageHoles,
    segments: context.pick(64, 16),
  });
}

/**
 * The egg's wall in one revolve of its cross-section (outside profile up to the apex, down the axis, inside profile
 * down to the floor): the same solid as the egg less its cavity, without a boolean.
 */
function podRing(p: Pick<PodParams, (typeof WALL_KEYS)[number]>, context: BuildContext): Outline {
  const { a, lower, ai, bli, floorRadius, floorZ, cutZ, upper, upperInner } = podFrame(p);
  const steps = context.pick(PROFILE_STEPS, 4);
  const outside = eggProfile({
    radiusMm: a,
    upperMm: upper,
    lowerMm: lower,
    cutZMm: cutZ,
    steps,
    coneTop: true,
    coneBottom: true,
  });
  const inside = eggProfile({
    radiusMm: ai,
    upperMm: upperInner,
    lowerMm: bli,
    cutZMm: floorZ,
    steps,
    coneTop: true,
    coneBottom: false,
  });
  // Both profiles start and end on the axis; the inside one, walked backwards, closes the ring. With cleaning access
  // the ring closes at the opening's radius instead, so the revolve has the opening already (the floor plug's
  // opening, with as many segments as the wall).
  const ring = [...outside, ...inside.reverse()];
  if (p.cleaningAccess) {
    const openingRadius = floorRadius - 15;
    ring[0] = [openingRadius, cutZ];
    ring[ring.length - 1] = [openingRadius, floorZ];
  }
  return ring;
}

/**
 * The wall's cross-section split at a height under every cut (entry, perch, vents): the part above, which the kernel
 * revolves and cuts, and the band below, revolved in JS ({@link joinRevolvedBand}); its edge from point `seamEdge` is
 * the seam. None without cleaning access (the drainage holes are cut in the floor) or when the band would be thin.
 */
function podBand(p: Pick<PodParams, (typeof BAND_KEYS)[number]>, context: BuildContext) {
  if (!p.cleaningAccess) return undefined;
  const { floorZ } = podFrame(p);
  const entryBottom = floorZ + p.holeAboveFloorMm;
  // The perch's teardrop points down √2 · 5 mm below its centre, 18 mm under the entry.
  const perchBottom = p.perch ? entryBottom - 18 - 5 * Math.SQRT2 : Infinity;
  const ventBottom = slotCentreZ(p) - SLOT_LENGTH_MM / 2;
  const seamZ = Math.min(entryBottom, perchBottom, ventBottom) - 3;
  if (seamZ < floorZ + 5) return undefined;
  const ring = podRing(p, context);
  // The ring starts at the bottom, rises along the outside and comes down the inside: it crosses the seam twice.
  const crossings: { i: number; point: [number, number] }[] = [];
  for (let i = 0; i < ring.length; i++) {
    const [r0, z0] = ring[i];
    const [r1, z1] = ring[(i + 1) % ring.length];
    if (z0 === seamZ) return undefined;
    if ((z0 - seamZ) * (z1 - seamZ) < 0)
      crossings.push({ i, point: [r0 + ((seamZ - z0) / (z1 - z0)) * (r1 - r0), seamZ] });
  }
  if (crossings.length !== 2) return undefined;
  const [up, down] = crossings;
  return {
    above: [up.point, ...ring.slice(up.i + 1, down.i + 1), down.point] as Outline,
    below: [...ring.slice(0, up.i + 1), up.point, down.point, ...ring.slice(down.i + 1)] as Outline,
    seamEdge: up.i + 1,
  };
}

/** The hanging tab on the apex (model coordinates): a 28 × 8 mm slab along x with its eye through it along y. */
function podTab(p: Pick<PodParams, (typeof CAVITY_KEYS)[number]>, context: BuildContext) {
  const { t, apexZ } = podFrame(p);
  // The tab's foot is a 45° ridge d below the outside cone: inside the wall everywhere under the tab (the outside
  // cone is at most |y| ≤ 4 mm lower at the tab's edge, the inside cone t·√2 lower), so the tab never reaches into the
  // cavity and joining it adds exactly what the tab adds above the wall.
  const d = (4 + t * Math.SQRT2) / 2;
  const top = apexZ + 18;
  const foot: Outline = [
    [-14, apexZ - d - 14],
    [0, apexZ - d],
    [14, apexZ - d - 14],
    [14, top],
    [-14, top],
  ];
  const eye = teardropOutline(8, context.pick(24, 12)).map(([x, z]): [number, number] => [x, z + apexZ + 8]);
  return { foot, top, eye, halfWidthMm: 14, halfDepthMm: 4 };
}

/**
 * The body's mesh with the hanging tab joined (plate coordinates, lowered by cutZ). The tab stands on the outside
 * cone's apex and nothing is cut near it, so it is joined to the finished mesh without a kernel operation; in a
 * degenerate case (a mesh vertex on the tab's outline) the kernel joins it to the whole body instead.
 */
function podWithTab(p: PodParams, mesh: IndexedMesh, whole: () => Solid, context: BuildContext): IndexedMesh {
  const { cutZ } = podFrame(p);
  const tab = podTab(p, context);
  const lowered = (outline: Outline): Outline => outline.map(([x, z]): [number, number] => [x, z - cutZ]);
  const joined = standPost(mesh, {
    x: [-tab.halfWidthMm, tab.halfWidthMm],
    y: [-tab.halfDepthMm, tab.halfDepthMm],
    topZ: tab.top - cutZ,
    // The outside cone under the tab lies above the equator; the only other upward faces under it (the inside floor)
    // lie below.
    surfaceAboveZ: -cutZ,
    holeXZ: lowered(tab.eye),
  });
  if (joined) return joined;
  const slab = Solid.prism(lowered(tab.foot), 'y', -tab.halfDepthMm, tab.halfDepthMm);
  const eye = Solid.prism(lowered(tab.eye), 'y', -tab.halfDepthMm - 1, tab.halfDepthMm + 1);
  return partMesh(whole().add(slab.subtract(eye)));
}

/** Height of the ventilation slots' centres (model coordinates). */
function slotCentreZ(p: Pick<PodParams, (typeof CAVITY_KEYS)[number]>): number {
  const { ai, upperInner, ceiling } = podFrame(p);
  return Math.min(upperInner * 0.55, ceiling(ai * 0.75) - SLOT_LENGTH_MM);
}

/** What is cut from the wall besides the entry: the ventilation slots, and the drainage holes without cleaning access. */
function podCuts(p: PodParams, context: BuildContext): Solid[] {
  const { a, ai } = podFrame(p);
  const cuts: Solid[] = [];
  const slotZ = slotCentreZ(p);
  for (let i = 0; i < p.ventilationSlots; i++) {
    const y = (i - (p.ventilationSlots - 1) / 2) * (SLOT_WIDTH_MM + 8);
    const slot = slotOutline(SLOT_WIDTH_MM, SLOT_LENGTH_MM).map(([u, v]): [number, number] => [u + y, v + slotZ]);
    cuts.push(Solid.prism(slot, 'x', ai * 0.5, a + 2), Solid.prism(slot, 'x', -a - 2, -ai * 0.5));
  }
  // The cleaning opening is in the wall's revolve; drainage holes are cut.
  if (!p.cleaningAccess) cuts.push(...podFloor(p, context).cuts);
  return cuts;
}
