/**
 * Worker scaling on PostgreSQL: one API process (JOBS_IN_API=false) and 1, 2 and 4 `npm run worker` processes
 * compute the same family (one job per variant); prints variants per second, the speed-up over one worker, the
 * efficiency per worker and per core in use. Needs a PostgreSQL role that may create databases:
 * `BENCH_DATABASE_URL` (or `TEST_DATABASE_URL`; `bash .ci/postgres.sh` starts one and prints it). Each round gets a
 * new database copied from a migrated and seeded template; everything is dropped at the end.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { availableParallelism, tmpdir } from 'node:os';
import { join } from 'node:path';
import { migrateDatabase, openPostgres } from '../server/db/client';
import { seedIfNew } from '../server/db/seed';
import { DEMO_PASSWORD } from '../server/db/seedDemo';
import { adminSql, benchDatabaseBase, urlFor } from './lib/benchDatabase';
import { API_READY, freePort, startProcess, tsxEntry, WORKER_READY, type ServerProcess } from './lib/serverProcess';

const WORKER_COUNTS = [1, 2, 4];
/** 16 entry-hole sizes x 2 colours. */
const ENTRY_HOLES_MM = Array.from({ length: 16 }, (_, i) => 26 + i * 0.5);

/** Creates a family through the API, computes it and resolves with the variant count and the seconds it took. */
async function computeFamily(base: string, code: string): Promise<{ variants: number; seconds: number }> {
  const headers = { Origin: base, 'Content-Type': 'application/json' };
  const signIn = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email: 'maren@fernhollow.test', password: DEMO_PASSWORD }),
  });
  const cookie = signIn.headers
    .getSetCookie()
    .map((line) => line.split(';')[0])
    .join('; ');
  const call = (path: string, init: RequestInit = {}) =>
    fetch(`${base}${path}`, { ...init, headers: { ...headers, Cookie: cookie } });
  const created = await call('/api/families', {
    method: 'POST',
    body: JSON.stringify({
      code,
      name: 'Bench Gable',
      templateId: 'gable-box',
      baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125 },
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: ENTRY_HOLES_MM },
        { kind: 'attribute', key: 'colour', values: ['sand', 'white'] },
      ],
      supportBudgetMm3: 12_000,
      printerId: 'rowan-farm-06',
      materialId: 'pla',
      region: 'europe',
    }),
  });
  if (created.status !== 201) throw new Error(`family not created: ${created.status} ${await created.text()}`);
  const familyId = ((await created.json()) as { family: { id: string } }).family.id;
  const started = performance.now();
  const compute = await call(`/api/families/${familyId}/compute`, { method: 'POST', body: '{}' });
  if (compute.status !== 202) throw new Error(`compute not started: ${compute.status}`);
  // Opened after the start: before it, the stream reports the family as it was (not computed).
  const stream = await call(`/api/families/${familyId}/progress`);
  const reader = stream.body!.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  let total = 0;
  for (;;) {
    const { value, done } = await reader.read();
    if (done) throw new Error('the progress stream ended before the family was done');
    buffer += value;
    let end: number;
    while ((end = buffer.indexOf('\n\n')) >= 0) {
      const block = buffer.slice(0, end);
      buffer = buffer.slice(end + 2);
      const data = block.split('\n').find((line) => line.startsWith('data: '));
      const event = data ? (JSON.parse(data.slice(6)) as { total: number; doneCount: number }) : undefined;
      if (event) total = event.total || total;
      if (block.startsWith('event: done')) {
        if (!event || event.doneCount !== event.total || event.total === 0)
          throw new Error(`the family ended with ${event?.doneCount ?? 0} of ${event?.total ?? 0} variants done`);
        const seconds = (performance.now() - started) / 1000;
        await reader.cancel();
        return { variants: total, seconds };
      }
    }
  }
}

/** Prints the figures. */
export default async function bench(): Promise<void> {
  const base = benchDatabaseBase();
  if (!base) {
    console.log('skipped: set BENCH_DATABASE_URL (a PostgreSQL role that may create databases; .ci/postgres.sh)');
    return;
  }
  const run = `nwb_${process.pid}_${Date.now().toString(36)}`;
  const template = `${run}_template`;
  await adminSql(base, `create database ${template}`);
  const created: string[] = [template];
  const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-scaling-'));
  try {
    const seeding = openPostgres({ url: urlFor(base, template), poolMax: 2, statementTimeoutMs: 0 });
    await migrateDatabase(seeding.db);
    await seedIfNew(seeding.db, { SEED_DEMO: true }, () => {});
    await seeding.pg.close();

    const cores = availableParallelism();
    const rows: Array<{ workers: number; variants: number; seconds: number; perSec: number }> = [];
    for (const workers of WORKER_COUNTS) {
      const database = `${run}_w${workers}`;
      await adminSql(base, `create database ${database} template ${template}`);
      created.push(database);
      const env = {
        DATABASE_URL: urlFor(base, database),
        DATA_DIR: dataDir,
        NODE_ENV: 'production',
        SEED_DEMO: 'false',
        JOB_POLL_SEC: '0.5',
      };
      const port = await freePort();
      const children: ServerProcess[] = [];
      try {
        children.push(
          await startProcess({
            label: 'api',
            args: tsxEntry('index'),
            env: { ...env, PORT: String(port), JOBS_IN_API: 'false' },
            ready: API_READY,
          }),
        );
        for (let i = 0; i < workers; i++)
          children.push(
            await startProcess({ label: `worker-${i + 1}`, args: tsxEntry('worker'), env, ready: WORKER_READY }),
          );
        const result = await computeFamily(`http://localhost:${port}`, `BW${workers}`);
        rows.push({ workers, ...result, perSec: result.variants / result.seconds });
        console.log(`  ${workers} worker(s): ${result.variants} variants in ${result.seconds.toFixed(1)} s`);
      } finally {
        await Promise.all(children.map((child) => child.stop()));
      }
    }
    const one = rows[0].perSec;
    console.log(`\nworker scaling on PostgreSQL (${cores} cores; one API process, family of 32 variants)`);
    console.log('workers  variants/s  speed-up  efficiency/worker  variants/s per core in use');
    for (const row of rows) {
      const speedUp = row.perSec / one;
      const coresInUse = Math.min(row.workers, cores);
      console.log(
        `${String(row.workers).padStart(7)}  ${row.perSec.toFixed(2).padStart(10)}  ${speedUp.toFixed(2).padStart(8)}` +
          `  ${`${((speedUp / row.workers) * 100).toFixed(0)} %`.padStart(17)}` +
          `  ${(row.perSec / coresInUse).toFixed(2).padStart(26)}`,
      );
    }
    console.log('(more workers than cores cannot run faster; the API process and PostgreSQL share the same cores)');
  } finally {
    for (const database of created.reverse())
      await adminSql(base, `drop database if exists ${database} with (force)`).catch(() => {});
    await rm(dataDir, { recursive: true, force: true });
  }
}
