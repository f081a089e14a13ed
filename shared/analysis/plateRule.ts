/**
 * The one plate rule, used by every figure that counts plates: the editor's figures, the mesh analysis and the CLI,
 * the variant reports, quotes, cost and farm run planning.
 *
 * The parts of one unit (a box body and its floor plug) go on one build plate together when a complete set fits;
 * then a plate holds as many complete sets as fit. Otherwise each part prints on plates of its own, as many copies
 * of that part as fit, and one unit needs one plate per part. A part larger than the printer does not fit at all.
 *
 * Sizes shown to sales and customers are the assembled product's ({@link assembledSizeMm}: the body, which the
 * templates build first and the other parts fit into), never the print layout's (parts laid side by side).
 */
import { describePlatePlan, fitPartSizes, platesForUnits, type PlateGroup, type UnitPlatePlan } from './fitParts';

/** The plate rule of one design on one printer. */
export interface PlateRule {
  /** Every part fits the printer on its own. */
  fits: boolean;
  layout: UnitPlatePlan['layout'];
  /** Plates one unit needs when printed alone: 1 together, one per part when separate, 0 when it does not fit. */
  platesPerUnit: number;
  /** One group when the parts go together, one per part when separate, none when a part does not fit. */
  groups: PlateGroup[];
  /** Complete units on one plate when the parts go together; null when they need plates of their own or do not fit. */
  unitsPerPlate: number | null;
  /** The rule in words: `3 per plate (all parts together)`, `2 plates per unit: body 1 per plate, …`. */
  text: string;
  /** A short label for a tag beside the figures. */
  tag: string;
  /** Tallest part: the build height that limits the printer, mm. */
  heightMm: number;
}

/**
 * The plate rule of a design's parts on a printer.
 * @param partSizesMm - each part's [x, y, z] size in build orientation, the body first
 * @param buildVolumeMm - printer build volume [x, y, z]
 * @param spacingMm - gap between parts (10 mm: common practice, no source)
 * @param partNames - part names in part order for the words (`body`, `floor-plug`)
 */
export function plateRule(
  partSizesMm: ReadonlyArray<readonly number[]>,
  buildVolumeMm: readonly number[],
  spacingMm = 10,
  partNames: readonly string[] = defaultPartNames(partSizesMm.length),
): PlateRule {
  const fit = fitPartSizes(partSizesMm, buildVolumeMm, spacingMm);
  const { plan } = fit;
  const unitsPerPlate = plan.layout === 'together' ? plan.groups[0].unitsPerPlate : null;
  return {
    fits: fit.fits,
    layout: plan.layout,
    platesPerUnit: plan.platesPerUnit,
    groups: plan.groups,
    unitsPerPlate,
    text: describePlatePlan(plan, partNames),
    tag:
      plan.layout === 'none'
        ? 'too large for this printer'
        : plan.layout === 'together'
          ? `fits: ${unitsPerPlate} per plate`
          : `fits: ${plan.platesPerUnit} plates per unit`,
    heightMm: fit.heightMm,
  };
}

/** `body`, `floor plug`, then `part 3`…: the names templates give their parts in build order. */
function defaultPartNames(count: number): string[] {
  return Array.from({ length: count }, (_, i) => (i === 0 ? 'body' : i === 1 ? 'floor plug' : `part ${i + 1}`));
}

/**
 * Build plates for a number of units under the rule: per plate group, units over the units one plate holds,
 * rounded up, summed.
 * @param rule - the plate rule
 * @param units - complete units wanted
 */
export function platesForOrder(rule: Pick<PlateRule, 'groups'>, units: number): number {
  return platesForUnits({ layout: 'together', groups: rule.groups, platesPerUnit: 0 }, units);
}

/**
 * Share of a unit's print time that each part takes, by bounding-box volume (the run planner shares time the same
 * way; an estimate: a box's time follows its walls more than its enclosed volume).
 * @param partSizesMm - each part's [x, y, z] size
 * @returns one share per part, summing to 1
 */
export function partTimeShares(partSizesMm: ReadonlyArray<readonly number[]>): number[] {
  const volumes = partSizesMm.map(([x, y, z]) => x * y * z);
  const total = volumes.reduce((sum, v) => sum + v, 0);
  return volumes.map((v) => (total > 0 ? v / total : 1 / volumes.length));
}

/**
 * The rule's plate groups for the farm capacity estimate: each group's units per plate and the print time of its
 * parts for one unit (the unit's time shared by {@link partTimeShares}). Copies per plate from a farm setting cap
 * each group's units per plate.
 * @param rule - the plate rule (a design that fits)
 * @param partSizesMm - the parts' sizes, for the time shares
 * @param unitPrintTimeMin - print time of one whole unit
 * @param maxUnitsPerPlate - a cap from the farm settings, or null
 */
export function farmPlateGroups(
  rule: Pick<PlateRule, 'groups'>,
  partSizesMm: ReadonlyArray<readonly number[]>,
  unitPrintTimeMin: number,
  maxUnitsPerPlate: number | null = null,
): Array<{ unitsPerPlate: number; printTimeMin: number }> {
  const shares = partTimeShares(partSizesMm);
  return rule.groups.map((group) => ({
    unitsPerPlate: Math.max(
      1,
      maxUnitsPerPlate ? Math.min(maxUnitsPerPlate, group.unitsPerPlate) : group.unitsPerPlate,
    ),
    printTimeMin: Math.max(1e-6, unitPrintTimeMin * group.partIndexes.reduce((sum, i) => sum + (shares[i] ?? 0), 0)),
  }));
}

/**
 * The assembled product's outside size: its body, the largest part, which the other parts (a floor plug) fit into
 * (templates build it first). A design of one part is its own size. The print layout (parts side by side) is never
 * a product size.
 * @param partSizesMm - each part's size; empty or absent when not known
 * @param wholeSizeMm - the size to use when the parts are not known (a variant computed before they were kept)
 */
export function assembledSizeMm(
  partSizesMm: ReadonlyArray<readonly number[]> | undefined,
  wholeSizeMm: readonly number[],
): [number, number, number] {
  let body = wholeSizeMm;
  if (partSizesMm && partSizesMm.length > 0) {
    const volume = (s: readonly number[]) => s[0] * s[1] * s[2];
    body = partSizesMm.reduce((best, size) => (volume(size) > volume(best) ? size : best), partSizesMm[0]);
  }
  return [body[0], body[1], body[2]];
}

/** The stored form of the rule in reports (variant reports, the analysis report). */
export interface PlateRuleSummary {
  layout: PlateRule['layout'];
  platesPerUnit: number;
  groups: PlateGroup[];
  text: string;
}

/**
 * The part of the rule a report keeps.
 * @param rule - the plate rule
 */
export function plateRuleSummary(rule: PlateRule): PlateRuleSummary {
  return { layout: rule.layout, platesPerUnit: rule.platesPerUnit, groups: rule.groups, text: rule.text };
}

/**
 * The build plates of an order in words, from the farm estimate under the rule: `11 plates of 4 units` when the
 * parts go together, `86 plates: 43 of body (1 a plate), 43 of floor plug (1 a plate)` when each part has plates of
 * its own.
 * @param farm - the order's plates, the copies per plate, and (under the rule) plates per unit and each group's plates
 * @param partNames - part names in part order
 */
export function describeOrderPlates(
  farm: {
    plates: number;
    copiesPerPlate: number;
    platesPerUnit?: number;
    groups?: ReadonlyArray<{ unitsPerPlate: number; plates: number }>;
  },
  partNames: readonly string[] = defaultPartNames(farm.groups?.length ?? 1),
): string {
  const groups = farm.groups ?? [];
  const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;
  if ((farm.platesPerUnit ?? 1) > 1 && groups.length > 1) {
    const each = groups.map((g, i) => `${g.plates} of ${partNames[i] ?? `part ${i + 1}`} (${g.unitsPerPlate} a plate)`);
    return `${plural(farm.plates, 'plate', 'plates')}: ${each.join(', ')}`;
  }
  const per = groups[0]?.unitsPerPlate ?? farm.copiesPerPlate;
  return `${plural(farm.plates, 'plate', 'plates')} of ${plural(per, 'unit', 'units')}`;
}
