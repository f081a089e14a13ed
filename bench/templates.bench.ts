/**
 * Template regeneration and server export speed. Per template: generate() (check parameters, build, mesh,
 * validate, hash) at the defaults and after a slider change (entry hole moved a step each time), then the server's
 * export path (worker thread round trip + STL). Prints wall-clock and this thread's CPU time, p50/p95, because the
 * machine is shared: CPU time is the steadier figure when other work competes for the two cores.
 * Targets (issue 3): p95 ≤ 100 ms for the box templates, ≤ 300 ms for the textured trunk.
 */
import { loadavg } from 'node:os';
import { writeStl } from '../shared/mesh/writeStl';
import { TEMPLATES, generate } from '../templates/index';
import { ExportWorker } from '../server/workers/ExportWorker';

const RUNS = 15;
const EXPORT_RUNS = 8;
const TARGET_P95_MS: Record<string, number> = { 'bark-trunk': 300 };

function percentile(values: number[], p: number): number {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)];
}

async function timeRuns(
  runs: number,
  body: (i: number) => Promise<unknown>,
): Promise<{ wall: number[]; cpu: number[] }> {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const cpuStart = process.cpuUsage();
    const start = performance.now();
    await body(i);
    wall.push(performance.now() - start);
    const used = process.cpuUsage(cpuStart);
    cpu.push((used.user + used.system) / 1000);
  }
  return { wall, cpu };
}

function line(label: string, t: { wall: number[]; cpu: number[] }, extra = ''): string {
  const f = (v: number): string => v.toFixed(0).padStart(5);
  return `  ${label.padEnd(26)} wall p50 ${f(percentile(t.wall, 50))} p95 ${f(percentile(t.wall, 95))} ms | cpu p50 ${f(percentile(t.cpu, 50))} p95 ${f(percentile(t.cpu, 95))} ms${extra}`;
}

/** Prints regeneration and export figures for every template. */
export default async function bench(): Promise<void> {
  console.log(
    `load average at start: ${loadavg()
      .map((v) => v.toFixed(1))
      .join(' / ')} (1/5/15 min)`,
  );
  for (const template of TEMPLATES) {
    const first = performance.now();
    const defaults = await generate(template.id, {});
    const coldMs = performance.now() - first;
    for (let i = 0; i < 3; i++) await generate(template.id, {});
    const target = TARGET_P95_MS[template.id] ?? 100;
    console.log(
      `${template.id} v${template.version}: ${defaults.triangles} triangles, ${defaults.partCount} parts, first build ${coldMs.toFixed(0)} ms, target p95 ≤ ${target} ms`,
    );
    const atDefaults = await timeRuns(RUNS, () => generate(template.id, {}));
    console.log(line('defaults', atDefaults));
    const slider = await timeRuns(RUNS, (i) => generate(template.id, { entryHoleDiameterMm: 30 + (i % 10) * 0.5 }));
    console.log(line('entry-hole slider moved', slider));
  }
  const worker = new ExportWorker(60_000);
  try {
    for (const template of TEMPLATES) {
      await worker.run(template.id, {}, { format: 'stl' });
      const exports = await timeRuns(EXPORT_RUNS, (i) =>
        worker.run(template.id, { entryHoleDiameterMm: 31 + i * 0.5 }, { format: 'stl' }),
      );
      console.log(line(`server export ${template.id}`, exports, ' (cpu = whole process, worker included)'));
    }
  } finally {
    await worker.close();
  }
  // A reference for the reader: the in-process write of the largest default mesh.
  const trunk = await generate('bark-trunk', {});
  const write = await timeRuns(5, async () => writeStl(trunk.mesh));
  console.log(line('writeStl bark-trunk', write));
  console.log(
    `load average at end: ${loadavg()
      .map((v) => v.toFixed(1))
      .join(' / ')}`,
  );
}
