/**
 * Several processes on one PostgreSQL (runs only with TEST_DATABASE_URL): two API processes (no jobs) and two
 * `npm run worker` processes. A 40-variant family is computed through API A while progress is read from API B; one
 * worker is killed with SIGKILL halfway. The family completes, every variant is stored exactly once (one progress
 * event per SKU, the done count equals the variant count) and progress reaches API B throughout.
 * Exactly-once and crash recovery are our own product rules (common practice, no source).
 */
import type { ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest';
import { API_READY, freePort, startProcess, tsxEntry, WORKER_READY } from '../bench/lib/serverProcess';
import { DEMO_PASSWORD } from '../server/db/seedDemo';
import { createDatabaseFrom, databaseUrl, dropDatabase, TEST_DATABASE_URL } from './setup/postgresTestDb';

const children: ChildProcess[] = [];
let dbName: string;
let dataDir: string;

/** Starts `server/<entry>.ts` under tsx and resolves when it is ready; kept to be killed at the end. */
async function start(entry: 'index' | 'worker', env: Record<string, string>): Promise<ChildProcess> {
  const ready = entry === 'index' ? API_READY : WORKER_READY;
  const started = await startProcess({ label: entry, args: tsxEntry(entry), env, ready, timeoutMs: 240_000 });
  children.push(started.child);
  return started.child;
}

/** A signed-in client of one API process (cookie kept by hand). */
async function signIn(base: string): Promise<(path: string, init?: RequestInit) => Promise<Response>> {
  const headers = { Origin: base, 'Content-Type': 'application/json' };
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers,
    body: JSON.stringify({ email: 'maren@fernhollow.test', password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  const cookie = res.headers
    .getSetCookie()
    .map((line) => line.split(';')[0])
    .join('; ');
  return (path, init = {}) => fetch(`${base}${path}`, { ...init, headers: { ...headers, Cookie: cookie } });
}

interface ProgressEvent {
  state: string;
  doneCount: number;
  total: number;
  variant?: { sku: string; verdict: string };
}

describe.skipIf(!TEST_DATABASE_URL)('two API processes and two workers on one PostgreSQL', () => {
  let apiA = '';
  let apiB = '';
  let workers: ChildProcess[] = [];

  beforeAll(async () => {
    dbName = await createDatabaseFrom(inject('pgSeededTemplate'));
    dataDir = await mkdtemp(join(tmpdir(), 'nestwright-scale-'));
    const common = {
      DATABASE_URL: databaseUrl(dbName),
      DATA_DIR: dataDir,
      NODE_ENV: 'test',
      JOB_POLL_SEC: '0.5',
      JOB_MAINTENANCE_SEC: '2',
      FAMILY_VARIANT_TIME_LIMIT_SEC: '20',
    };
    const [portA, portB] = [await freePort(), await freePort()];
    const started = await Promise.all([
      start('index', { ...common, PORT: String(portA), JOBS_IN_API: 'false' }),
      start('index', { ...common, PORT: String(portB), JOBS_IN_API: 'false' }),
      start('worker', common),
      start('worker', common),
    ]);
    workers = started.slice(2);
    apiA = `http://localhost:${portA}`;
    apiB = `http://localhost:${portB}`;
  }, 300_000);

  afterAll(async () => {
    for (const child of children) if (child.exitCode === null) child.kill('SIGKILL');
    if (dbName) await dropDatabase(dbName);
    if (dataDir) await rm(dataDir, { recursive: true, force: true });
  });

  it('completes a 40-variant family with every variant exactly once after a worker is killed halfway', async () => {
    const onA = await signIn(apiA);
    const onB = await signIn(apiB);
    const entries = Array.from({ length: 20 }, (_, i) => 25 + i * 0.5);
    const created = await onA('/api/families', {
      method: 'POST',
      body: JSON.stringify({
        code: `SC${Date.now().toString(36).slice(-4).toUpperCase()}`,
        name: 'Scale Gable',
        templateId: 'gable-box',
        baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125 },
        axes: [
          { kind: 'param', key: 'entryHoleDiameterMm', values: entries },
          { kind: 'attribute', key: 'colour', values: ['sand', 'white'] },
        ],
        supportBudgetMm3: 12_000,
        printerId: 'rowan-farm-06',
        materialId: 'pla',
        region: 'europe',
      }),
    });
    expect(created.status, await created.clone().text()).toBe(201);
    const familyId = ((await created.json()) as { family: { id: string } }).family.id;

    // The computation is started on API A and its progress read on API B.
    const started = await onA(`/api/families/${familyId}/compute`, { method: 'POST', body: '{}' });
    expect(started.status).toBe(202);
    const stream = await onB(`/api/families/${familyId}/progress`);
    expect(stream.status).toBe(200);
    const events: ProgressEvent[] = [];
    let killed = false;
    const reading = (async () => {
      const reader = stream.body!.pipeThrough(new TextDecoderStream()).getReader();
      let buffer = '';
      for (;;) {
        const { value, done } = await reader.read();
        if (done) return;
        buffer += value;
        let end: number;
        while ((end = buffer.indexOf('\n\n')) >= 0) {
          const block = buffer.slice(0, end);
          buffer = buffer.slice(end + 2);
          const data = block.split('\n').find((line) => line.startsWith('data: '));
          if (!data) continue;
          const event = JSON.parse(data.slice(6)) as ProgressEvent;
          events.push(event);
          if (!killed && event.total > 0 && event.doneCount >= event.total / 2) {
            killed = true;
            workers[0].kill('SIGKILL');
          }
          if (block.startsWith('event: done')) return;
        }
      }
    })();
    await reading;

    expect(killed).toBe(true);
    const last = events.at(-1)!;
    expect(last.state).toBe('done');
    expect(last.total).toBe(40);
    expect(last.doneCount).toBe(40);
    const skus = events.flatMap((event) => (event.variant ? [event.variant.sku] : []));
    expect(new Set(skus).size).toBe(skus.length);
    // Progress reached API B throughout: from the first event on, done counts rise one by one to 40, across the kill.
    const counts = events.filter((event) => event.variant).map((event) => event.doneCount);
    expect(counts.at(-1)).toBe(40);
    expect(counts.every((count, i) => i === 0 || count === counts[i - 1] + 1)).toBe(true);
    expect(counts.length).toBeGreaterThanOrEqual(20);

    const variants = (await (await onA(`/api/families/${familyId}/variants?pageSize=500`)).json()) as {
      variants: Array<{ sku: string; status: string }>;
    };
    expect(variants.variants).toHaveLength(40);
    expect(new Set(variants.variants.map((v) => v.sku)).size).toBe(40);
    for (const sku of skus) expect(variants.variants.map((v) => v.sku)).toContain(sku);
    expect(variants.variants.every((v) => v.status === 'done')).toBe(true);
  }, 600_000);
});
