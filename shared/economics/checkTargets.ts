import type { ProductionTargets, TargetCheck, TargetDriver, TargetFigures, TargetKey } from '../schemas/wallRecipe';
import { CONVECTION_CELL_MM } from '../thermal/wallResistance';
import { insulationTargetRM2KW } from './insulationTarget';
import { formatMoney } from '../format';

/** Labels of the four targets, for bars and messages. */
export const TARGET_LABELS: Record<TargetKey, string> = {
  'unit-cost': 'Unit cost',
  'print-hours': 'Print time',
  mass: 'Mass',
  insulation: 'Wall insulation',
};

/**
 * Each target that is set, checked against a design's figures: the figure, the limit, whether it is met and by how
 * much it is missed. Cost, hours and mass are upper limits; insulation is a lower limit.
 * @param figures - unit cost, print time, mass and wall R of one design or variant
 * @param targets - the family's targets (unset targets are skipped)
 * @param drivers - optionally, the parameter that moves each figure most (from {@link findTargetDrivers})
 * @returns one check per set target, in the order cost, hours, mass, insulation
 */
export function checkTargets(
  figures: TargetFigures,
  targets: ProductionTargets,
  drivers: Partial<Record<TargetKey, TargetDriver | null>> = {},
): TargetCheck[] {
  const checks: TargetCheck[] = [];
  const upper = (key: TargetKey, value: number, limit: number | null): void => {
    if (limit === null) return;
    const overBy = Math.max(0, value - limit);
    checks.push({
      key,
      label: TARGET_LABELS[key],
      value,
      limit,
      met: value <= limit,
      overBy,
      overByPct: (overBy / limit) * 100,
      driver: drivers[key] ?? null,
      note: null,
    });
  };
  upper('unit-cost', figures.unitCostCents, targets.maxUnitCostCents);
  upper('print-hours', figures.printTimeMin / 60, targets.maxPrintHours);
  upper('mass', figures.massG, targets.maxMassG);
  if (targets.minInsulation && figures.wallRM2KW !== null) {
    const limit = insulationTargetRM2KW(targets.minInsulation);
    const overBy = Math.max(0, limit - figures.wallRM2KW);
    // Cells where air moves make the conduction figure optimistic, so such a wall does not meet the target.
    const cellMm = figures.wallCellMm ?? null;
    const convects = cellMm !== null && cellMm > CONVECTION_CELL_MM + 1e-9;
    const cells = Number.isFinite(cellMm) ? `air cells of about ${cellMm!.toFixed(1)} mm` : 'an empty core';
    const remedy =
      figures.wallCellInfillPct != null ? `; at least ${figures.wallCellInfillPct} % infill keeps them smaller` : '';
    checks.push({
      key: 'insulation',
      label: TARGET_LABELS.insulation,
      value: figures.wallRM2KW,
      limit,
      met: figures.wallRM2KW >= limit && !convects,
      overBy,
      overByPct: (overBy / limit) * 100,
      driver: drivers.insulation ?? null,
      note: convects
        ? `the infill leaves ${cells}, above the ${CONVECTION_CELL_MM} mm where air starts to move, so the ` +
          `conduction figure does not hold${remedy}`
        : null,
    });
  }
  return checks;
}

/** A numeric parameter the sensitivity check may move, with its step and unit. */
export interface SensitivityParameter {
  key: string;
  label: string;
  step: number;
  unit: string;
  /** Allowed range: the step goes up unless that leaves the range, then down. */
  min: number;
  max: number;
}

/**
 * Which parameter moves each figure most, by finite differences: every numeric parameter is moved by one step (up,
 * or down at the top of its range) and the figures are evaluated again; the parameter whose step changes a figure
 * most (per step, in the figure's unit) is its driver. Parameters whose evaluation fails (the template refuses the
 * value) are skipped.
 * @param base - the design's figures now
 * @param values - the design's current numeric parameter values by key
 * @param parameters - the parameters to try
 * @param evaluate - the figures of the design with one parameter changed
 * @param keys - which targets need a driver (default: all four)
 * @returns the driver per target, null where no parameter moved the figure
 */
export async function findTargetDrivers(
  base: TargetFigures,
  values: Record<string, number>,
  parameters: readonly SensitivityParameter[],
  evaluate: (changed: Record<string, number>) => Promise<TargetFigures>,
  keys: readonly TargetKey[] = ['unit-cost', 'print-hours', 'mass', 'insulation'],
): Promise<Record<TargetKey, TargetDriver | null>> {
  const best: Record<TargetKey, TargetDriver | null> = {
    'unit-cost': null,
    'print-hours': null,
    mass: null,
    insulation: null,
  };
  for (const param of parameters) {
    const current = values[param.key];
    if (current === undefined) continue;
    const up = current + param.step <= param.max + 1e-9;
    const moved = up ? current + param.step : current - param.step;
    if (moved < param.min - 1e-9) continue;
    let figures: TargetFigures;
    try {
      figures = await evaluate({ [param.key]: moved });
    } catch {
      continue;
    }
    const sign = up ? 1 : -1;
    const effects: Record<TargetKey, number | null> = {
      'unit-cost': (figures.unitCostCents - base.unitCostCents) * sign,
      'print-hours': ((figures.printTimeMin - base.printTimeMin) / 60) * sign,
      mass: (figures.massG - base.massG) * sign,
      insulation:
        figures.wallRM2KW !== null && base.wallRM2KW !== null ? (figures.wallRM2KW - base.wallRM2KW) * sign : null,
    };
    for (const key of keys) {
      const effect = effects[key];
      if (effect === null || Math.abs(effect) < 1e-12) continue;
      const held = best[key];
      if (!held || Math.abs(effect) > Math.abs(held.effectPerStep)) {
        best[key] = { key: param.key, label: param.label, step: param.step, unit: param.unit, effectPerStep: effect };
      }
    }
  }
  return best;
}

/**
 * A check in words for the gate and the editor, e.g. "unit cost €31.20 is €3.20 (11 %) over the €28.00
 * target; wall thickness moves it most (+0.5 mm adds €1.15)".
 * @param check - a target check
 * @param currency - currency of the cents values
 */
export function describeTargetCheck(check: TargetCheck, currency: string): string {
  const fmt = (value: number): string => formatTargetValue(check.key, value, currency);
  const head = check.met
    ? `${check.label.toLowerCase()} ${fmt(check.value)} is within the ${fmt(check.limit)} target`
    : check.note && check.overBy === 0
      ? `${check.label.toLowerCase()} R ${fmt(check.value)} reaches the R ${fmt(check.limit)} target, but ${check.note}`
      : check.key === 'insulation'
        ? `${check.label.toLowerCase()} R ${fmt(check.value)} is ${fmt(check.overBy)} (${Math.round(check.overByPct)} %) ` +
          `short of the R ${fmt(check.limit)} target`
        : `${check.label.toLowerCase()} ${fmt(check.value)} is ${fmt(check.overBy)} (${Math.round(check.overByPct)} %) ` +
          `over the ${fmt(check.limit)} target`;
  // A convection note names its own remedy (more infill), so no driver is added to it.
  if (check.note && !check.met) return check.overBy > 0 ? `${head}, and ${check.note}` : head;
  if (!check.driver) return head;
  const d = check.driver;
  const verb = d.effectPerStep >= 0 ? 'adds' : 'takes off';
  return (
    `${head}; ${d.label.toLowerCase()} moves it most ` +
    `(+${d.step}${d.unit ? ` ${d.unit}` : ''} ${verb} ${fmt(Math.abs(d.effectPerStep))})`
  );
}

/**
 * A target figure with its unit: cents as money, hours, grams, or R in m²K/W.
 * @param key - which target
 * @param value - the figure in the target's unit
 * @param currency - currency of cents values
 */
export function formatTargetValue(key: TargetKey, value: number, currency: string): string {
  switch (key) {
    case 'unit-cost':
      return formatMoney(value, currency);
    case 'print-hours':
      return `${value.toFixed(1)} h`;
    case 'mass':
      return `${Math.round(value)} g`;
    case 'insulation':
      return `${value.toFixed(3)} m²K/W`;
  }
}
