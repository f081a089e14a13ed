import type { BirdFitResult, BirdFitWarning, Region, Species, SpeciesFit } from '../schemas/birdfit';
import { NestBoxFactsSchema, type NestBoxFacts } from '../schemas/nestbox';
import { SPECIES } from './species';
import { PINE_BOARD_MM, PINE_K_WMK } from '../thermal/wallResistance';

/** Entry holes are matched within this many millimetres of the published range (print tolerance; common practice, no source). */
export const HOLE_TOLERANCE_MM = 1;
/** Floor, depth and hole height may fall this share short of the published minimum (assumption, no source). */
export const SIZE_TOLERANCE = 0.05;
/** A hole wider than 1½ in admits European starlings (a low-authority web source, from memory otherwise). */
export const STARLING_SAFE_HOLE_MM = 38.1;
/** House sparrows use a 32 mm hole (RSPB, NABU). */
export const HOUSE_SPARROW_HOLE_MM = 32;
/** Bottom of the hole above the inside floor: RSPB ≥ 125 mm (BTO and Which? 120 mm; NABU 170 mm). */
export const MIN_HOLE_ABOVE_FLOOR_MM = 125;
/** ¾ in boards (Cornell; OEBS) and ≥ 15 mm (BTO; Which?). */
export const WOOD_WALL_MM = 19;
/** Solid printed PLA (MakeItFrom data sheet; Zmeskal et al. give 0.12). */
const PLA_K_WMK = 0.13;
/** The lower of the published wood-wall minimums (BTO; Which?). */
export const MIN_WOOD_WALL_MM = 15;

const fmt = (n: number) => `${Math.round(n * 10) / 10}`;

/** Options of {@link assessBirdFit}. */
export interface AssessBirdFitOptions {
  /** Only species and regional warnings of this region; both regions when omitted. */
  region?: Region;
  /** The wall as chosen and printed: the thin-wall warning names the material and quotes the figure's percent. */
  wall?: ThinWallFigures;
}

/** What the thin-wall warning says about the chosen wall: the same numbers the insulation figure shows. */
export interface ThinWallFigures {
  /** The chosen material's name (PLA, PETG, …). */
  materialName: string;
  /** Conductivity of the solid printed material, W/m·K; used when the printed wall's resistance is not known. */
  polymerK?: number;
  /**
   * The printed wall's resistance as a share of a 19 mm pine board (perimeters and infill core), as the figures show
   * it (OutdoorAssessment.wallResistance.ratioToPine); without it the wall is taken as solid material.
   */
  ratioToPine?: number | null;
}

/**
 * The thin-wall warning for a wall thinner than a ¾ in board: where its thickness stands against the 15–19 mm of
 * wood that guidance asks for, and how well it insulates beside a 19 mm pine board, in the chosen material. The
 * percent is the printed wall's figure when given (the one the insulation bars show), else a solid wall's
 * (thickness / k against 19 mm / 0.11 W/m·K). Severity follows the guidance, which is about thickness: `warning`
 * below 15 mm, `caution` from 15 to 19 mm (conduction is not the whole heat balance: a thin plastic shell also
 * heats through in sun). Null at 19 mm and over.
 * @param wallThicknessMm - the designed wall thickness
 * @param wall - the chosen material and the printed wall's figure (PLA, solid, when omitted)
 */
export function thinWallWarning(
  wallThicknessMm: number,
  wall: ThinWallFigures = { materialName: 'PLA' },
): BirdFitWarning | null {
  if (wallThicknessMm >= WOOD_WALL_MM) return null;
  const t = fmt(wallThicknessMm);
  const printed = wall.ratioToPine !== undefined && wall.ratioToPine !== null;
  const ratio = printed
    ? wall.ratioToPine!
    : wallThicknessMm / (wall.polymerK ?? PLA_K_WMK) / (PINE_BOARD_MM / PINE_K_WMK);
  const pct = Math.round(ratio * 100);
  const where =
    wallThicknessMm < MIN_WOOD_WALL_MM
      ? `Walls of ${t} mm are thinner than the ${MIN_WOOD_WALL_MM}–${WOOD_WALL_MM} mm of wood that guidance asks for.`
      : `Walls of ${t} mm are within the ${MIN_WOOD_WALL_MM}–${WOOD_WALL_MM} mm of wood that guidance asks for, but ` +
        `thinner than a ¾ in (${WOOD_WALL_MM} mm) board.`;
  const how = printed
    ? `As printed in ${wall.materialName} (solid perimeters round an infill core) this wall insulates about ${pct} % ` +
      'as well as a ¾ in pine board'
    : `A solid ${wall.materialName} wall this thick insulates about ${pct} % as well as a ¾ in pine board`;
  const then =
    ratio >= 1
      ? ', so by conduction it matches the board; a thin plastic shell still heats through in sun: choose a light ' +
        'colour, ventilation, a roof overhang and a shaded site.'
      : '. Compensate with thicker walls holding closed air cells (check the wall resistance), a light colour, ' +
        'ventilation, a roof overhang and a shaded site.';
  return {
    code: 'thin-walls',
    severity: wallThicknessMm < MIN_WOOD_WALL_MM ? 'warning' : 'caution',
    message: `${where} ${how}${then}`,
    source:
      'Cornell (¾ in walls); BTO and Which? (≥ 15 mm; thin plastic boxes overheat); conductivity of ' +
      `${wall.materialName} (material data sheet; Zmeskal 2020 for PLA) and pine (USDA Wood Handbook)`,
  };
}

function fitOne(facts: NestBoxFacts, s: Species): SpeciesFit {
  const reasons: string[] = [];
  const hole = facts.entryHoleDiameterMm;
  const lo = s.holeDiameterMm.min - HOLE_TOLERANCE_MM;
  const hi = s.holeDiameterMm.max + HOLE_TOLERANCE_MM;
  const range = (r: { min: number; max: number }) =>
    r.min === r.max ? `${fmt(r.min)}` : `${fmt(r.min)}–${fmt(r.max)}`;
  if (hole < lo || hole > hi) {
    reasons.push(`entry ${fmt(hole)} mm; the table gives ${range(s.holeDiameterMm)} mm`);
  }
  const boxOval = facts.entryHoleHeightMm !== undefined && Math.abs(facts.entryHoleHeightMm - hole) > 2;
  if (s.holeHeightMm) {
    const h = facts.entryHoleHeightMm ?? hole;
    if (h < s.holeHeightMm.min - HOLE_TOLERANCE_MM || h > s.holeHeightMm.max + HOLE_TOLERANCE_MM) {
      reasons.push(`entry height ${fmt(h)} mm; this species uses an oval entry ${range(s.holeHeightMm)} mm high`);
    }
  } else if (boxOval) {
    reasons.push('oval entry; the table gives a round hole');
  }
  const floor = Math.min(facts.floorWidthMm, facts.floorDepthMm);
  if (floor < s.floorMm.min * (1 - SIZE_TOLERANCE)) {
    reasons.push(`floor ${fmt(floor)} mm across; at least ${fmt(s.floorMm.min)} mm`);
  }
  if (facts.cavityDepthMm < s.cavityDepthMm.min * (1 - SIZE_TOLERANCE)) {
    reasons.push(`cavity ${fmt(facts.cavityDepthMm)} mm deep; at least ${fmt(s.cavityDepthMm.min)} mm`);
  }
  if (facts.holeAboveFloorMm < s.holeAboveFloorMm.min * (1 - SIZE_TOLERANCE)) {
    reasons.push(`hole ${fmt(facts.holeAboveFloorMm)} mm above the floor; at least ${fmt(s.holeAboveFloorMm.min)} mm`);
  }
  return {
    speciesId: s.id,
    commonName: s.commonName,
    region: s.region,
    suits: reasons.length === 0,
    reasons,
    mountingHeightM: s.mountingHeightM,
    source: s.source,
  };
}

/**
 * Which species a nest box suits, with the reasons for each no, and the guidance a seller must show (perch, holes
 * that admit unwanted species, drainage, ventilation, hole height, wall thickness, cleaning, mounting, predators,
 * heat). The species values and rules come from published tables; the texts defer to local rules and experts.
 * @param facts - inside dimensions and features of the box
 * @param options - restrict to one region
 * @returns the species verdicts, the suited wanted species and the warnings
 */
export function assessBirdFit(facts: NestBoxFacts, options: AssessBirdFitOptions = {}): BirdFitResult {
  const f = NestBoxFactsSchema.parse(facts);
  const inRegion = (r: Region) => options.region === undefined || options.region === r;
  const species = SPECIES.filter((s) => inRegion(s.region)).map((s) => fitOne(f, s));
  const wantedIds = new Set(SPECIES.filter((s) => s.wanted).map((s) => s.id));
  const suits = species.filter((s) => s.suits && wantedIds.has(s.speciesId));
  const warnings: BirdFitWarning[] = [];
  const hole = f.entryHoleDiameterMm;
  const entryHeight = f.entryHoleHeightMm ?? hole;

  if (f.hasPerch) {
    warnings.push({
      code: 'perch',
      severity: 'warning',
      message:
        'Leave the perch off: cavity-nesting birds do not need one, and it gives predators, starlings and house ' +
        'sparrows a foothold at the entrance.',
      source: 'USFWS "For the Birds" (2001); Cornell "Features of a good nest box"',
    });
  }
  if (inRegion('north-america') && Math.min(hole, entryHeight) > STARLING_SAFE_HOLE_MM + 0.5) {
    warnings.push({
      code: 'admits-starlings',
      severity: 'warning',
      region: 'north-america',
      message:
        `A ${fmt(hole)} mm entry is wider than 1½ in (38 mm) and lets in European starlings, an introduced species ` +
        'in North America that takes boxes from native birds. Keep to 1½ in unless the box is meant for larger ' +
        'native species, and then monitor it; follow local rules on managing introduced species.',
      source:
        'Bureau of Biological Survey table (starling 2 in hole); "a 1½ in hole keeps starlings out" (low-authority web source)',
    });
  }
  if (Math.min(hole, entryHeight) >= HOUSE_SPARROW_HOLE_MM - 1) {
    if (inRegion('north-america')) {
      warnings.push({
        code: 'admits-house-sparrows',
        severity: 'caution',
        region: 'north-america',
        message:
          `A ${fmt(hole)} mm entry admits house sparrows, introduced in North America, where they compete with ` +
          'bluebirds, swallows and chickadees. Monitor the box; local groups advise on what to do.',
        source: 'RSPB and NABU: house sparrows use a 32 mm hole',
      });
    }
    if (inRegion('europe')) {
      warnings.push({
        code: 'admits-house-sparrows',
        severity: 'info',
        region: 'europe',
        message: `A ${fmt(hole)} mm entry admits house sparrows, a native species in Europe; smaller tits prefer a 25–28 mm hole.`,
        source: 'RSPB and NABU hole sizes',
      });
    }
  }
  if (f.drainageHoleCount === 0) {
    warnings.push({
      code: 'no-drainage',
      severity: 'warning',
      message:
        'Add drainage: a few small holes in the floor (about 5–6 mm) let rain and wet nest material dry out; a ' +
        'printed box does not soak water up like wood and holds any water that gets in.',
      source: 'RSPB and BTO (small floor holes); NABU (four holes of about 5 mm); USFWS (¼ in holes)',
    });
  }
  if (f.ventilationAreaMm2 === 0) {
    warnings.push({
      code: 'no-ventilation',
      severity: 'warning',
      message: 'Add ventilation holes or slots near the top of the side walls so heat can escape on sunny days.',
      source: 'Cornell nest-box features; Bird-Lore (1922) via Audubon (2024)',
    });
  }
  if (f.holeAboveFloorMm + entryHeight > f.cavityDepthMm) {
    warnings.push({
      code: 'hole-too-high-for-cavity',
      severity: 'warning',
      message: `The entry (${fmt(f.holeAboveFloorMm)} mm up, ${fmt(entryHeight)} mm high) does not fit below the roof at ${fmt(f.cavityDepthMm)} mm.`,
      source: 'geometry of the box',
    });
  }
  if (f.holeAboveFloorMm < MIN_HOLE_ABOVE_FLOOR_MM) {
    warnings.push({
      code: 'hole-low-above-floor',
      severity: 'caution',
      message:
        `The hole is ${fmt(f.holeAboveFloorMm)} mm above the floor. European guidance asks for at least 120–125 mm ` +
        '(NABU 170 mm) so cats and woodpeckers cannot reach the nestlings and the young do not leave too early; ' +
        'only wrens, swallows and martins in the North American table use lower holes.',
      source: 'RSPB (≥ 125 mm); BTO and Which? (≥ 120 mm); NABU (≥ 170 mm)',
    });
  }
  const thin = thinWallWarning(f.wallThicknessMm, options.wall);
  if (thin) warnings.push(thin);
  if (!f.cleaningAccess) {
    warnings.push({
      code: 'no-cleaning-access',
      severity: 'warning',
      message:
        'Give the box an opening side or roof so old nests can be cleared out after the season and the box monitored.',
      source: 'Cornell nest-box features; USFWS "For the Birds"',
    });
  }
  const heights = suits.map((s) => `${s.commonName} ${s.mountingHeightM.min}–${s.mountingHeightM.max} m`);
  warnings.push({
    code: 'mounting-height',
    severity: 'info',
    message:
      (heights.length > 0 ? `Published mounting heights: ${heights.join('; ')}. ` : '') +
      'Mount the box out of reach of cats, facing away from the strongest sun and wind; follow local guidance.',
    source: 'Bureau of Biological Survey table; RSPB (2–4 m, north to east unless shaded)',
  });
  warnings.push({
    code: 'predator-guard',
    severity: 'info',
    message:
      'On posts, a smooth pole with a baffle keeps climbing predators off; a metal plate round the hole stops ' +
      'woodpeckers and squirrels enlarging it.',
    source: 'NestWatch FAQ on predators; RSPB and Which? (hole plates)',
  });
  warnings.push({
    code: 'plastic-heat',
    severity: 'caution',
    message:
      'Thin plastic boxes can overheat or hold condensation. Check the outdoor assessment for the chosen colour and ' +
      'defer to local bird-conservation advice.',
    source: 'BTO "Nest boxes: your essential guide"; Which?',
  });
  if (suits.length === 0) {
    warnings.push({
      code: 'no-species-match',
      severity: 'caution',
      message: 'The box matches no species in the table; see the reasons beside each species.',
      source: 'species table',
    });
  }
  return { suits, species, warnings };
}
