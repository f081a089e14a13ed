import { partTimeShares, plateRule } from '../analysis/plateRule';
import {
  PlanItemSchema,
  PlanSettingsSchema,
  type PlanFilament,
  type PlanItem,
  type PlanLine,
  type PlannedPlate,
  type PlanSettingsInput,
  type RunPlan,
} from '../schemas/plan';
import { packPlates, plateLowerBound, type FootprintToPack } from './packPlates';
import { printersNeeded, schedulePlates } from './schedulePlates';

const DAY_MS = 86_400_000;
/** Grams of filament on one spool (1 kg spools: common practice, no source). */
const SPOOL_G = 1000;

const NOTES = [
  'Parts of one material and colour share plates; each plate prints one colour.',
  'Plates are packed in rows, largest footprints first, with the plate rule gap between parts; the lower bound is ' +
    'the total footprint area with gaps over the plate area.',
  "A unit's print time is shared among its parts by bounding-box volume.",
  'A plate takes the warm-up plus its parts; a failed plate is printed again, so machine hours, filament and set-up ' +
    'cost carry the failure rate as an allowance.',
  'On demand, every unit is one job on a plate of its own (its parts together when they fit one plate); in a run, ' +
    'plate set-up is shared by the parts on the plate and the job set-up by the whole run.',
  'Printers needed: fewest printers whose schedule (longest plates first, to the printer free soonest) ends within ' +
    'the machine hours before the date, less the handling days.',
];

/**
 * Plans one run at a farm: packs the parts of every unit onto plates (several variants per plate, one colour per
 * plate), schedules the plates over the fewest printers that finish by the date, sums filament by colour and
 * compares the cost of a unit in the run with the cost of printing it on demand.
 * @param items - variants and quantities with the engine's per-part sizes, print time, mass and unit cost
 * @param settingsInput - the farm's plate, hours and rates, and the dates
 * @throws RangeError when a part fits no plate
 */
export function planRun(items: readonly PlanItem[], settingsInput: PlanSettingsInput): RunPlan {
  const settings = PlanSettingsSchema.parse(settingsInput);
  const list = items.map((item) => PlanItemSchema.parse(item));
  const [bx, by] = settings.buildVolumeMm;
  const plate: [number, number] = [bx, by];
  const s = settings.spacingMm;
  const failure = settings.failureRatePct / 100;
  const reprintFactor = 1 / (1 - failure);

  // Per-part print minutes by bounding-box volume share.
  const partMinutes = list.map((item) =>
    partTimeShares(item.partSizesMm).map((share) => item.unitPrintTimeMin * share),
  );

  // Group units by material and colour; every unit's every part is a footprint.
  const groups = new Map<string, { materialId: string; colourId: string; footprints: FootprintToPack[] }>();
  const keyInfo: Array<{ item: number; part: number }> = [];
  list.forEach((item, itemIndex) => {
    const groupKey = `${item.materialId}\u0000${item.colourId}`;
    const group = groups.get(groupKey) ?? { materialId: item.materialId, colourId: item.colourId, footprints: [] };
    groups.set(groupKey, group);
    for (let unit = 0; unit < item.quantity; unit++)
      item.partSizesMm.forEach(([x, y], part) => {
        group.footprints.push({ key: keyInfo.length, widthMm: x, depthMm: y });
        keyInfo.push({ item: itemIndex, part });
      });
  });

  const plates: PlannedPlate[] = [];
  let lowerBoundPlates = 0;
  for (const group of groups.values()) {
    lowerBoundPlates += plateLowerBound(group.footprints, plate, s);
    for (const packed of packPlates(group.footprints, plate, s)) {
      const parts = packed.map((placed) => {
        const info = keyInfo[placed.key];
        return {
          sku: list[info.item].sku,
          part: info.part,
          xMm: placed.xMm,
          yMm: placed.yMm,
          widthMm: placed.widthMm,
          depthMm: placed.depthMm,
          turned: placed.turned,
        };
      });
      const partsMin = packed.reduce((sum, placed) => {
        const info = keyInfo[placed.key];
        return sum + partMinutes[info.item][info.part];
      }, 0);
      const coverMm2 = packed.reduce((sum, placed) => sum + placed.widthMm * placed.depthMm, 0);
      plates.push({
        index: plates.length,
        materialId: group.materialId,
        colourId: group.colourId,
        parts,
        printTimeMin: settings.plateWarmUpMin + partsMin,
        coveragePct: (100 * coverMm2) / (bx * by),
      });
    }
  }

  // Schedule: each plate's expected machine hours include its reprint allowance.
  const plateHours = plates.map((p) => (p.printTimeMin / 60) * reprintFactor);
  const printingDays =
    (Date.parse(settings.finishBy) - Date.parse(settings.startDate)) / DAY_MS - settings.handlingDays;
  const hoursAvailablePerPrinter = Math.max(0, printingDays * settings.hoursPerDay);
  const needed = printersNeeded(plateHours, hoursAvailablePerPrinter);
  const feasible = needed !== undefined;
  const scheduled = schedulePlates(plateHours, Math.max(1, needed ?? plates.length));
  const plainHours = plates.reduce((sum, p) => sum + p.printTimeMin / 60, 0);
  const printerHours = plainHours * reprintFactor;

  // Filament by material and colour, with the reprint allowance.
  const filamentMap = new Map<string, PlanFilament>();
  for (const item of list) {
    const key = `${item.materialId}\u0000${item.colourId}`;
    const entry = filamentMap.get(key) ?? {
      materialId: item.materialId,
      colourId: item.colourId,
      massG: 0,
      lengthM: 0,
      spools: 0,
    };
    entry.massG += item.unitMassG * item.quantity * reprintFactor;
    entry.lengthM += item.unitFilamentLengthM * item.quantity * reprintFactor;
    filamentMap.set(key, entry);
  }
  const filament = [...filamentMap.values()].map((entry) => ({
    ...entry,
    spools: Math.ceil(entry.massG / SPOOL_G - 1e-9),
  }));

  // Money: plate set-up (warm-up machine time and energy, plate change labour) and job set-up.
  const plateSetupCents =
    ((settings.plateWarmUpMin / 60) * settings.machineRateCentsPerHour +
      ((settings.averagePowerW * settings.plateWarmUpMin) / 60 / 1000) * settings.electricityCentsPerKwh +
      (settings.plateChangeMin / 60) * settings.labourCentsPerHour) *
    reprintFactor;
  const jobSetupCents = (settings.jobSetupMin / 60) * settings.labourCentsPerHour;
  const units = list.reduce((sum, item) => sum + item.quantity, 0);

  const setupShareCents = list.map(() => 0);
  const indexBySku = new Map(list.map((item, i) => [item.sku, i]));
  for (const p of plates) {
    const minutes = p.parts.map((part) => {
      const itemIndex = indexBySku.get(part.sku) ?? 0;
      return { itemIndex, min: partMinutes[itemIndex][part.part] };
    });
    const total = minutes.reduce((sum, m) => sum + m.min, 0);
    for (const m of minutes)
      setupShareCents[m.itemIndex] += total > 0 ? (plateSetupCents * m.min) / total : plateSetupCents / minutes.length;
  }

  const lines: PlanLine[] = list.map((item, i) => {
    // On demand a unit is printed alone, on the plates the plate rule gives it.
    const platesPerUnit = Math.max(1, plateRule(item.partSizesMm, settings.buildVolumeMm, s).platesPerUnit);
    const onDemandUnitCents = Math.round(item.unitCostCents + platesPerUnit * plateSetupCents + jobSetupCents);
    const runUnitCents = Math.round(
      item.unitCostCents + setupShareCents[i] / item.quantity + (units > 0 ? jobSetupCents / units : 0),
    );
    return {
      sku: item.sku,
      label: item.label,
      quantity: item.quantity,
      onDemandUnitCents,
      runUnitCents,
      savingUnitCents: onDemandUnitCents - runUnitCents,
    };
  });
  const onDemandCents = lines.reduce((sum, line) => sum + line.onDemandUnitCents * line.quantity, 0);
  const runCents = lines.reduce((sum, line) => sum + line.runUnitCents * line.quantity, 0);

  return {
    plates,
    lowerBoundPlates,
    printerHours,
    reprintAllowanceH: printerHours - plainHours,
    hoursAvailablePerPrinter,
    printersNeeded: needed ?? 0,
    schedule: scheduled.queues,
    finishH: scheduled.makespanH,
    feasible,
    filament,
    lines,
    totals: {
      units,
      onDemandCents,
      runCents,
      savingCents: onDemandCents - runCents,
      savingPct: onDemandCents > 0 ? (100 * (onDemandCents - runCents)) / onDemandCents : 0,
    },
    currency: settings.currency,
    notes: [...NOTES],
  };
}
