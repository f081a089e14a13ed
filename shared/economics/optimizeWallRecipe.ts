import { estimateProductionUnchecked } from '../production/estimateProduction';
import {
  WallOptimizeOptionsSchema,
  type WallOptimizeOptions,
  type WallOptimum,
  type WallRecipePoint,
} from '../schemas/wallRecipe';
import type { PrinterProfile, ProductionInput } from '../schemas/production';
import {
  AIR_K_WMK,
  PINE_BOARD_MM,
  boardResistanceM2KW,
  gridCellSizeMm,
  wallResistance,
  wallResistanceM2KW,
} from '../thermal/wallResistance';
import { interpolateWallSample } from './interpolateWallSample';
import { paretoFront } from './paretoFront';
import { insulationTargetRM2KW } from './insulationTarget';

/** Infill densities kept in the plotted cloud besides the front: every multiple of this, %. */
const CLOUD_INFILL_STEP_PCT = 5;

/**
 * The cheapest way to print a design's walls so that they insulate at least as well as a target, and the trade-off
 * around it. Searched: wall thickness on its step grid within the given range, perimeters per face, and infill
 * density, keeping only infill whose air cells stay below `maxCellMm` (larger cells let air circulate and the
 * conduction model no longer holds). Infill pattern is not searched: the parallel-path model gives every pattern
 * whose webs run across the wall the same resistance.
 *
 * How: the insulation is the parallel-path resistance of shared/thermal (solid perimeters plus an air-and-polymer
 * core), which grows with thickness, so for each perimeters × infill pair the thinnest wall that meets the target
 * has a closed form; the production estimate prices it and the cheapest pair wins (assuming, as the estimate does,
 * that a thicker wall never costs less). The Pareto front of cost, print time and R is taken over the whole grid.
 * The design's geometry between the measured thicknesses is interpolated linearly.
 * @param options - measured samples, thickness range, target, printer, material, settings, rates and search bounds
 * @returns the best recipe (or why there is none), the front, a plotting cloud and the model's limits
 */
export function optimizeWallRecipe(options: WallOptimizeOptions): WallOptimum {
  const o = WallOptimizeOptionsSchema.parse(options);
  const { material } = o;
  const k = material.thermalConductivityWmK;
  const targetRM2KW = insulationTargetRM2KW(o.target);
  const inputAt = interpolateWallSample(o.samples);
  const thicknesses = stepGrid(o.wallRangeMm.min, o.wallRangeMm.max, o.wallRangeMm.step);
  const inputs = new Map<number, ProductionInput>();
  const inputFor = (t: number): ProductionInput => {
    let input = inputs.get(t);
    if (!input) {
      input = inputAt(t);
      inputs.set(t, input);
    }
    return input;
  };

  let best: WallRecipePoint | null = null;
  const all: WallRecipePoint[] = [];
  let searched = 0;
  let noInfill: string | null = null;
  for (const printer of o.printers) {
    const one = searchPrinter(o, printer, thicknesses, inputFor, targetRM2KW);
    searched += one.searched;
    all.push(...one.points);
    if (one.best && (!best || better(one.best, best))) best = one.best;
    noInfill ??= one.noInfill;
  }
  const front = paretoFront(all);
  const onFront = new Set(front);
  const cloud = all.filter((p) => !onFront.has(p));

  let reason: string | null = null;
  if (all.length === 0) {
    reason = noInfill;
  } else if (!best) {
    const thickest = all.reduce((a, b) => (b.rM2KW > a.rM2KW ? b : a));
    reason =
      `No recipe reaches R ${targetRM2KW.toFixed(3)} m²K/W: the best is ${thickest.rM2KW.toFixed(3)} m²K/W at ` +
      `${thickest.recipe.wallThicknessMm} mm, ${thickest.recipe.perimeters} perimeters and ` +
      `${thickest.recipe.infillPct} % infill. Allow a thicker wall or a lower target.`;
  }
  const shown = best ?? (all.length > 0 ? all.reduce((a, b) => (b.rM2KW > a.rM2KW ? b : a)) : null);
  const shownPrinter = o.printers.find((p) => p.id === shown?.printerId) ?? o.printers[0]!;
  const limits = shown
    ? wallResistance({ ...shown.recipe, lineWidthMm: shownPrinter.lineWidthMm, polymerK: k }).limits
    : [`Air k ${AIR_K_WMK} W/m·K, polymer k ${k} W/m·K, conduction only.`];
  limits.push(
    'Infill pattern is not searched: the parallel-path model gives every pattern whose webs cross the wall the ' +
      'same resistance, although measured patterns differ (Lopes et al., Polymers 15(10):2268, 2023).',
    `Geometry between measured wall thicknesses is interpolated; print time and cost are the production estimate's.`,
  );
  return { targetRM2KW, best, front, cloud, searched, reason, limits, currency: o.rates.currency };
}

type ParsedOptions = ReturnType<typeof WallOptimizeOptionsSchema.parse>;

/** The best recipe and the evaluated grid points on one printer. */
function searchPrinter(
  o: ParsedOptions,
  printer: PrinterProfile,
  thicknesses: readonly number[],
  inputFor: (t: number) => ProductionInput,
  targetRM2KW: number,
): { best: WallRecipePoint | null; points: WallRecipePoint[]; searched: number; noInfill: string | null } {
  const { material } = o;
  const lineMm = printer.lineWidthMm;
  const k = material.thermalConductivityWmK;
  const pineRM2KW = boardResistanceM2KW(PINE_BOARD_MM);
  const perimeterCounts = range(o.minPerimeters, Math.max(o.minPerimeters, o.maxPerimeters), 1);
  const infills = range(o.minInfillPct, o.maxInfillPct, o.infillStepPct).filter(
    (pct) => gridCellSizeMm(lineMm, pct) <= o.maxCellMm + 1e-9,
  );
  let searched = 0;
  const evaluate = (t: number, perimeters: number, infillPct: number): WallRecipePoint => {
    searched++;
    const estimate = estimateProductionUnchecked(
      inputFor(t),
      printer,
      material,
      { ...o.settings, perimeters, infillPct },
      o.rates,
      o.finishId,
    );
    const rM2KW = wallResistanceM2KW(t, perimeters, lineMm, infillPct, k);
    const allSkin = 2 * perimeters * lineMm >= t;
    return {
      recipe: { wallThicknessMm: t, perimeters, infillPct },
      printerId: printer.id,
      unitCostCents: estimate.cost.totalCents,
      printTimeMin: estimate.printTimeMin,
      massG: estimate.massG,
      rM2KW,
      ratioToPine: rM2KW / pineRM2KW,
      cellSizeMm: allSkin ? null : gridCellSizeMm(lineMm, infillPct),
    };
  };

  // The cheapest recipe: per perimeters × infill, the thinnest wall on the grid that reaches the target.
  let best: WallRecipePoint | null = null;
  for (const perimeters of perimeterCounts) {
    for (const infillPct of infills) {
      const t = thinnestOnGrid(thicknesses, targetRM2KW, perimeters, lineMm, infillPct, k);
      if (t === null) continue;
      const point = evaluate(t, perimeters, infillPct);
      if (!best || better(point, best)) best = point;
    }
  }

  // The front: at a given thickness, more infill or more perimeters put polymer (k 0.13) where air (k 0.026) was,
  // so they add plastic, time and cost and lower R; only the fewest perimeters with the least allowed infill can be
  // on the front at each thickness. Those candidates and a coarse cloud of the rest are evaluated; the test checks
  // the front against the whole grid.
  const cloudInfills = infills.filter((pct, i) => i === 0 || pct % CLOUD_INFILL_STEP_PCT === 0);
  const all: WallRecipePoint[] = [];
  for (const t of thicknesses)
    for (const perimeters of perimeterCounts)
      for (const infillPct of perimeters === perimeterCounts[0] ? cloudInfills : cloudInfills.slice(1))
        all.push(evaluate(t, perimeters, infillPct));
  if (best && !all.some((p) => sameRecipe(p, best!))) all.push(best);
  const noInfill =
    infills.length === 0
      ? `No infill between ${o.minInfillPct} % and ${o.maxInfillPct} % keeps the air cells of ${lineMm} mm lines ` +
        `below ${o.maxCellMm} mm: allow at least ${Math.ceil((200 * lineMm) / o.maxCellMm)} % infill.`
      : null;
  return { best, points: all, searched, noInfill };
}

function sameRecipe(a: WallRecipePoint, b: WallRecipePoint): boolean {
  return (
    a.printerId === b.printerId &&
    a.recipe.wallThicknessMm === b.recipe.wallThicknessMm &&
    a.recipe.perimeters === b.recipe.perimeters &&
    a.recipe.infillPct === b.recipe.infillPct
  );
}

/** Cheaper wins; then faster; then the better insulating. */
function better(a: WallRecipePoint, b: WallRecipePoint): boolean {
  if (a.unitCostCents !== b.unitCostCents) return a.unitCostCents < b.unitCostCents;
  if (a.printTimeMin !== b.printTimeMin) return a.printTimeMin < b.printTimeMin;
  return a.rM2KW > b.rM2KW;
}

/**
 * The thinnest grid thickness whose resistance reaches the target. R(t) is t / k_polymer while the wall is all
 * perimeters and skin / k_polymer + (t − skin) / k_core beyond, both increasing in t, so the bound has a closed form;
 * the grid value is checked against the model itself to stay exact at the rounding edge.
 */
function thinnestOnGrid(
  thicknesses: readonly number[],
  targetRM2KW: number,
  perimeters: number,
  lineMm: number,
  infillPct: number,
  k: number,
): number | null {
  const skinMm = 2 * perimeters * lineMm;
  const skinR = skinMm / 1000 / k;
  const fill = infillPct / 100;
  const coreK = fill * k + (1 - fill) * AIR_K_WMK;
  const boundMm = targetRM2KW <= skinR ? targetRM2KW * k * 1000 : skinMm + (targetRM2KW - skinR) * coreK * 1000;
  let i = thicknesses.findIndex((t) => t >= boundMm - 1e-9);
  if (i < 0) return null;
  while (i < thicknesses.length && wallResistanceM2KW(thicknesses[i]!, perimeters, lineMm, infillPct, k) < targetRM2KW)
    i++;
  return i < thicknesses.length ? thicknesses[i]! : null;
}

/** min, min + step, … up to max (inclusive within rounding), each rounded to 1e-6. */
function stepGrid(min: number, max: number, step: number): number[] {
  const out: number[] = [];
  for (let i = 0; min + i * step <= max + 1e-9; i++) out.push(Math.round((min + i * step) * 1e6) / 1e6);
  return out;
}

function range(from: number, to: number, step: number): number[] {
  return stepGrid(from, to, step);
}
