/**
 * Speed of the production, outdoor and bird-fit computations: how many calls per second one core manages
 * (an orientation search may call the production estimate once per candidate).
 */
import { assessBirdFit } from '../shared/birdfit/assessBirdFit';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS, DEFAULT_RATES, DEFAULT_SETTINGS } from '../shared/production/defaults';
import { estimateProduction } from '../shared/production/estimateProduction';
import { assessOutdoor } from '../shared/thermal/assessOutdoor';
import type { NestBoxFacts } from '../shared/schemas/nestbox';

function rate(label: string, calls: number, fn: (i: number) => unknown): void {
  for (let i = 0; i < Math.min(200, calls); i++) fn(i); // warm up
  const started = performance.now();
  for (let i = 0; i < calls; i++) fn(i);
  const ms = performance.now() - started;
  console.log(
    `${label}: ${Math.round((calls / ms) * 1000).toLocaleString('en')} calls/s (${((ms / calls) * 1000).toFixed(1)} µs each)`,
  );
}

/** Prints calls per second of estimateProduction, assessOutdoor and assessBirdFit. */
export default async function bench(): Promise<void> {
  const printer = DEFAULT_PRINTERS[0]!;
  const pla = DEFAULT_MATERIALS[0]!;
  rate('estimateProduction', 20000, (i) =>
    estimateProduction(
      {
        volumeMm3: 150000 + i,
        surfaceAreaMm2: 90000,
        heightMm: 220,
        supportVolumeMm3: 12000,
        bboxSizeMm: [140, 150, 220],
        footprintMm2: 14000,
      },
      printer,
      pla,
      DEFAULT_SETTINGS,
      DEFAULT_RATES,
    ),
  );
  rate('assessOutdoor', 20000, (i) => assessOutdoor({ material: pla, colourId: i % 2 ? 'white' : 'black' }));
  const box: NestBoxFacts = {
    entryHoleDiameterMm: 28,
    floorWidthMm: 120,
    floorDepthMm: 120,
    cavityDepthMm: 170,
    holeAboveFloorMm: 125,
    wallThicknessMm: 6,
    hasPerch: false,
    drainageHoleCount: 4,
    ventilationAreaMm2: 300,
    cleaningAccess: true,
    chambers: 1,
  };
  rate('assessBirdFit', 20000, (i) => assessBirdFit({ ...box, entryHoleDiameterMm: 25 + (i % 20) }));
}
