import type { PrinterQueue } from '../schemas/plan';

/** A schedule of plates over printers. */
export interface PlateSchedule {
  queues: PrinterQueue[];
  /** Busiest printer's hours. */
  makespanH: number;
}

/**
 * Spreads plates over printers, longest plate first, each to the printer that is free soonest (ties: lowest
 * printer number). Plates run one after another on a printer, measured in machine hours.
 * @param plateHours - hours of each plate, by plate index
 * @param printers - number of printers (≥ 1)
 */
export function schedulePlates(plateHours: readonly number[], printers: number): PlateSchedule {
  const queues: PrinterQueue[] = Array.from({ length: printers }, (_, printer) => ({ printer, plates: [], busyH: 0 }));
  const order = plateHours
    .map((hours, plate) => ({ hours, plate }))
    .sort((a, b) => b.hours - a.hours || a.plate - b.plate);
  for (const { hours, plate } of order) {
    let soonest = queues[0];
    for (const queue of queues) if (queue.busyH < soonest.busyH - 1e-12) soonest = queue;
    soonest.plates.push({ plate, startH: soonest.busyH, endH: soonest.busyH + hours });
    soonest.busyH += hours;
  }
  return { queues, makespanH: Math.max(0, ...queues.map((queue) => queue.busyH)) };
}

/**
 * Fewest printers whose schedule ({@link schedulePlates}) finishes within the hours available, searching from the
 * bound total hours / hours available upwards; undefined when even one printer per plate cannot (a plate is longer
 * than the time available).
 * @param plateHours - hours of each plate
 * @param hoursAvailable - machine hours one printer has before the deadline
 */
export function printersNeeded(plateHours: readonly number[], hoursAvailable: number): number | undefined {
  if (plateHours.length === 0) return 0;
  if (hoursAvailable <= 0 || Math.max(...plateHours) > hoursAvailable + 1e-9) return undefined;
  const total = plateHours.reduce((sum, hours) => sum + hours, 0);
  for (let printers = Math.max(1, Math.ceil(total / hoursAvailable - 1e-9)); printers <= plateHours.length; printers++)
    if (schedulePlates(plateHours, printers).makespanH <= hoursAvailable + 1e-9) return printers;
  return plateHours.length;
}
