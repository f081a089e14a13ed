/**
 * Speed of the wall-recipe optimizer for one design (the default gable box): measuring the design at four wall
 * thicknesses (template build + geometry, done once per design), then the search itself on the farm profile and on
 * every demo printer. Target: the search under 200 ms for one design.
 */
import { optimizeWallRecipe } from '../shared/economics/optimizeWallRecipe';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import type { PrinterProfile } from '../shared/schemas/production';
import { measureWallSamples, sampleThicknesses } from '../src/workers/measureWallSamples';

const RANGE = { min: 4, max: 20, step: 0.5 };

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)]!;
}

/** Prints the sampling time and the median search time of 15 runs for one and for four printers. */
export default async function bench(): Promise<void> {
  const farm = DEFAULT_PRINTERS[0]!;
  const plate: [number, number, number] = [farm.buildVolumeMm.x, farm.buildVolumeMm.y, farm.buildVolumeMm.z];
  const thicknesses = sampleThicknesses(RANGE.min, RANGE.max, RANGE.step, 4);
  await measureWallSamples('gable-box', {}, [10], plate); // warm the template kernel
  let started = performance.now();
  const samples = await measureWallSamples('gable-box', {}, thicknesses, plate);
  const sampleMs = performance.now() - started;
  console.log(`measure the gable box at ${thicknesses.join(', ')} mm: ${sampleMs.toFixed(0)} ms (once per design)`);

  const run = (printers: PrinterProfile[]): { ms: number; searched: number; front: number } => {
    const times: number[] = [];
    let last = null as ReturnType<typeof optimizeWallRecipe> | null;
    for (let i = 0; i < 15; i++) {
      started = performance.now();
      last = optimizeWallRecipe({
        samples,
        wallRangeMm: RANGE,
        target: { kind: 'pine-board', boardMm: 19 },
        printers,
        material: DEFAULT_MATERIALS[0]!,
        settings: DEFAULT_SETTINGS,
        rates: DEFAULT_RATES,
      });
      times.push(performance.now() - started);
    }
    return { ms: median(times), searched: last!.searched, front: last!.front.length };
  };
  for (const printers of [[farm], DEFAULT_PRINTERS]) {
    const r = run(printers);
    const verdict = r.ms < 200 ? 'under' : 'OVER';
    console.log(
      `optimize on ${printers.length} printer(s): median ${r.ms.toFixed(1)} ms for ${r.searched} recipes, ` +
        `front of ${r.front} (${verdict} the 200 ms target)`,
    );
  }
}
