import { FarmCapacityInputSchema, type FarmCapacity, type FarmCapacityInput } from '../schemas/production';

/**
 * Plates, print days and lead time for an order on a number of printers.
 * Plates are sized so that the expected good units (after the failure rate) cover the order; plates are spread
 * evenly over the printers and run one after another, each taking copies × unit time + plate change.
 * @param input - order size, printers, machine hours per day, copies per plate, unit print time, failure rate
 * @returns the capacity figures for a quote
 */
export function estimateFarmCapacity(input: FarmCapacityInput): FarmCapacity {
  const o = FarmCapacityInputSchema.parse(input);
  const goodPerPlate = o.copiesPerPlate * (1 - o.failureRatePct / 100);
  const plates = Math.ceil(o.unitsWanted / goodPerPlate - 1e-9);
  const platesPerPrinter = Math.ceil(plates / o.printers);
  const plateTimeMin = o.copiesPerPlate * o.printTimeMin + o.plateChangeMin;
  const printDays = (platesPerPrinter * plateTimeMin) / (o.hoursPerDay * 60);
  return {
    plates,
    platesPerPrinter,
    plateTimeMin,
    expectedGoodUnits: plates * goodPerPlate,
    printDays,
    leadTimeDays: Math.ceil(printDays - 1e-9) + Math.ceil(o.handlingDays),
  };
}
