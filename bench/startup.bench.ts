/**
 * `npm run bench -- startup`: how long a restart on an existing database takes, from spawning the process that
 * `npm start` runs to its "ready" line (target ≤ 3 s). A first start seeds a new DATA_DIR (not counted); then the
 * server is stopped and started again several times on it, and each restart prints its stages.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { startServerProcess } from './lib/serverProcess';

/** Restarts measured (the first one may still warm the disk cache). */
const RESTARTS = 5;

/** Runs the bench and prints its figures. */
export default async function startupBench(): Promise<void> {
  const dataDir = mkdtempSync(join(tmpdir(), 'nestwright-bench-startup-'));
  const port = Number(process.env.BENCH_PORT ?? 3392);
  try {
    console.log(`first start on a new DATA_DIR (${dataDir}): seeds the demo, builds what is stale; not counted`);
    const first = await startServerProcess({ label: 'first', dataDir, port });
    console.log(`  ready after ${(first.readyMs / 1000).toFixed(1)} s`);
    await first.stop();
    const times: number[] = [];
    for (let run = 1; run <= RESTARTS; run++) {
      const load = loadavg()[0];
      const server = await startServerProcess({ label: `restart ${run}`, dataDir, port });
      await server.stop();
      times.push(server.readyMs);
      console.log(`\nrestart ${run}: ready in ${Math.round(server.readyMs)} ms (load average ${load.toFixed(2)})`);
      for (const line of server.lines.filter((l) => l.startsWith('  '))) console.log(`  ${line}`);
    }
    const sorted = [...times].sort((a, b) => a - b);
    console.log(
      `\nrestart, process spawn to ready: median ${Math.round(sorted[Math.floor(sorted.length / 2)])} ms, ` +
        `best ${Math.round(sorted[0])} ms, worst ${Math.round(sorted[sorted.length - 1])} ms (target ≤ 3000 ms); ` +
        `load average now ${loadavg()
          .map((v) => v.toFixed(2))
          .join(', ')}`,
    );
  } finally {
    rmSync(dataDir, { recursive: true, force: true });
  }
}
