import { FarmCapacityInputSchema, type FarmCapacity, type FarmCapacityInput } from '../schemas/production';

/**
 * Plates, print days and lead time for an order on a number of printers, under the plate rule.
 * Each plate group (all parts together, or each part on plates of its own) gets enough plates that the expected good
 * units (after the failure rate) cover the order; each group's plates are spread evenly over the printers and run
 * one after another, each taking units per plate × the group's print time per unit + plate change.
 * @param input - order size, printers, machine hours per day, plate groups (or copies per plate and unit print time),
 *   failure rate
 * @returns the capacity figures for a quote
 */
export function estimateFarmCapacity(input: FarmCapacityInput): FarmCapacity {
  const o = FarmCapacityInputSchema.parse(input);
  const groupsIn = o.plateGroups ?? [{ unitsPerPlate: o.copiesPerPlate, printTimeMin: o.printTimeMin }];
  const keep = 1 - o.failureRatePct / 100;
  const groups = groupsIn.map((group) => ({
    unitsPerPlate: group.unitsPerPlate,
    plates: Math.ceil(o.unitsWanted / (group.unitsPerPlate * keep) - 1e-9),
    plateTimeMin: group.unitsPerPlate * group.printTimeMin + o.plateChangeMin,
  }));
  const plates = groups.reduce((sum, g) => sum + g.plates, 0);
  const perPrinter = groups.map((g) => Math.ceil(g.plates / o.printers));
  const platesPerPrinter = perPrinter.reduce((sum, n) => sum + n, 0);
  const busiestMin = groups.reduce((sum, g, i) => sum + perPrinter[i] * g.plateTimeMin, 0);
  const printDays = busiestMin / (o.hoursPerDay * 60);
  // Every group makes at least the units wanted; the set count is limited by the group that makes fewest.
  const expectedGoodUnits = Math.min(...groups.map((g) => g.plates * g.unitsPerPlate * keep));
  return {
    plates,
    platesPerPrinter,
    plateTimeMin: Math.max(...groups.map((g) => g.plateTimeMin)),
    groups: o.plateGroups ? groups : [],
    expectedGoodUnits,
    printDays,
    leadTimeDays: Math.ceil(printDays - 1e-9) + Math.ceil(o.handlingDays),
  };
}
