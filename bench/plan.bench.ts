/**
 * Speed of the run planner: a plan for 1,000 units of 40 variants (five colours, one- and two-part designs of nest
 * box sizes) on 256 mm plates, with its plate count against the area bound.
 */
import { buildPlateFit } from '../shared/analysis/buildPlateFit';
import { planRun } from '../shared/planning/planRun';
import type { PlanItem } from '../shared/schemas/plan';

const COLOURS = ['white', 'sand', 'moss-green', 'bark-brown', 'black'];

/** 40 invented variants, 25 units each: boxes 110–190 mm wide, every other one with a floor plug. */
function variants(): PlanItem[] {
  return Array.from({ length: 40 }, (_, i) => {
    const w = 110 + ((i * 37) % 81);
    const d = 100 + ((i * 53) % 91);
    const parts: Array<[number, number, number]> = [[w, d, 140 + (i % 5) * 20]];
    if (i % 2 === 0) parts.push([w - 30, d - 30, 12]);
    return {
      sku: `BENCH-${String(i).padStart(2, '0')}`,
      label: `Bench variant ${i}`,
      materialId: 'pla',
      colourId: COLOURS[i % COLOURS.length],
      quantity: 25,
      partSizesMm: parts,
      unitPrintTimeMin: 240 + i * 3,
      unitMassG: 180 + i,
      unitFilamentLengthM: 60 + i / 3,
      unitCostCents: 700 + i * 5,
    };
  });
}

/** Prints the time of one plan and its figures. */
export default async function bench(): Promise<void> {
  const items = variants();
  const settings = {
    buildVolumeMm: [256, 256, 256] as [number, number, number],
    plateWarmUpMin: 5,
    machineRateCentsPerHour: 90,
    averagePowerW: 190,
    electricityCentsPerKwh: 30,
    labourCentsPerHour: 2500,
    failureRatePct: 5,
    hoursPerDay: 22,
    startDate: '2026-03-02',
    finishBy: '2026-03-16',
    currency: 'EUR',
  };
  planRun(items, settings); // warm up
  const runs = 5;
  const started = performance.now();
  let plan = planRun(items, settings);
  for (let i = 1; i < runs; i++) plan = planRun(items, settings);
  const ms = (performance.now() - started) / runs;
  // Each part of each variant on plates of its own by the plate rule, for comparison with mixed plates.
  const alone = items.reduce(
    (sum, item) =>
      sum +
      item.partSizesMm.reduce(
        (n, size) => n + Math.ceil(item.quantity / buildPlateFit(size, settings.buildVolumeMm, 10).copiesPerPlate),
        0,
      ),
    0,
  );
  console.log(
    `plan 1,000 units of 40 variants: ${ms.toFixed(1)} ms per plan (mean of ${runs}); ${plan.plates.length} plates ` +
      `(area bound ${plan.lowerBoundPlates}, ${alone} with each part on plates of its own), ${plan.printerHours.toFixed(0)} printer-hours, ` +
      `${plan.printersNeeded} printers to finish in ${plan.hoursAvailablePerPrinter} h, saving ` +
      `${plan.totals.savingPct.toFixed(1)} % against on demand`,
  );
}
