/**
 * Losing nothing: 10 cycles of concurrent writes through the API (designers' presets and shop orders), then
 * `kill -9` of the server while writes are still in flight, then a restart. Every write the server acknowledged
 * (201) before it died must be there after the restart, on PGlite (DATA_DIR) and on PostgreSQL. Runs with
 * TEST_DATABASE_URL only (`npm run test:postgres` in CI), so that `npm test` stays short. The limits are generous:
 * eleven starts of the server take minutes on a loaded machine.
 * An acknowledged write surviving a crash is the durability property of ACID transactions (common practice, no
 * source).
 */
import type { ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it, inject } from 'vitest';
import { API_READY, freePort, startProcess, tsxEntry } from '../bench/lib/serverProcess';
import { DEMO_PASSWORD } from '../server/db/seedDemo';
import { createDatabaseFrom, databaseUrl, dropDatabase, TEST_DATABASE_URL } from './setup/postgresTestDb';

const CYCLES = 10;
const WRITES_PER_CYCLE = 12;
const ORDERS_PER_CYCLE = 3;
/** A published SKU of the seeded demo family. */
const SKU = 'FH-HGB-28-SHIN-MOSS';
const cleanups: Array<() => Promise<void>> = [];
const children = new Set<ChildProcess>();

afterAll(async () => {
  for (const child of children) if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  for (const cleanup of cleanups) await cleanup();
});

/** Starts the production entry and resolves with the process and its address once it is ready. */
async function startServer(env: Record<string, string>): Promise<{ child: ChildProcess; base: string }> {
  const started = await startProcess({
    label: 'server',
    args: tsxEntry('index'),
    env: { NODE_ENV: 'test', ...env },
    ready: API_READY,
    timeoutMs: 600_000,
  });
  children.add(started.child);
  return { child: started.child, base: started.url };
}

/** Kills a server with SIGKILL and waits until it is gone. */
async function killServer(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const gone = new Promise((done) => child.once('exit', done));
  child.kill('SIGKILL');
  await gone;
}

async function signIn(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { Origin: base, 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  return res.headers
    .getSetCookie()
    .map((line) => line.split(';')[0])
    .join('; ');
}

/** Runs the crash cycles against one server configuration. */
async function crashCycles(env: Record<string, string>): Promise<void> {
  const presets: string[] = [];
  const orders: string[] = [];
  for (let cycle = 0; cycle <= CYCLES; cycle++) {
    const { child, base } = await startServer({ ...env, PORT: String(await freePort()), CHECKOUT_RATE_LIMIT: '10000' });
    const json = { Origin: base, 'Content-Type': 'application/json' };
    const designer = { ...json, Cookie: await signIn(base, 'maren@fernhollow.test') };
    const operations = { ...json, Cookie: await signIn(base, 'ines@fernhollow.test') };
    // Everything acknowledged before any earlier crash is still there.
    for (const id of presets) {
      const res = await fetch(`${base}/api/presets/${id}`, { headers: designer });
      expect(res.status, `preset ${id} acknowledged before a crash`).toBe(200);
    }
    for (const id of orders) {
      const res = await fetch(`${base}/api/orders/${id}`, { headers: operations });
      expect(res.status, `order ${id} acknowledged before a crash`).toBe(200);
    }
    if (cycle === CYCLES) {
      await killServer(child);
      break;
    }
    const acknowledge = (list: string[], key: 'id' | 'orderId') => async (res: Response) => {
      if (res.status === 201) list.push(((await res.json()) as Record<string, string>)[key]);
    };
    const cutOff = () => {}; // cut off by the kill: not acknowledged
    const writePreset = (n: number) =>
      fetch(`${base}/api/presets`, {
        method: 'POST',
        headers: designer,
        body: JSON.stringify({ templateId: 'gable-box', name: `Crash ${cycle}-${n}-${Date.now()}`, params: {} }),
      }).then(acknowledge(presets, 'id'), cutOff);
    const writeOrder = (n: number) =>
      fetch(`${base}/api/shop/checkout`, {
        method: 'POST',
        headers: json,
        body: JSON.stringify({
          email: `crash-${cycle}-${n}@example.test`,
          shipTo: {
            name: 'Wren Fieldfare',
            line1: '4 Orchard Row',
            city: 'Ashby',
            postalCode: 'AB1 2CD',
            country: 'GB',
          },
          items: [{ sku: SKU, quantity: 1 + (n % 3) }],
        }),
      }).then(acknowledge(orders, 'orderId'), cutOff);
    const batch = (first: number) => [
      ...Array.from({ length: WRITES_PER_CYCLE }, (_, n) => writePreset(first * WRITES_PER_CYCLE + n)),
      ...Array.from({ length: ORDERS_PER_CYCLE }, (_, n) => writeOrder(first * ORDERS_PER_CYCLE + n)),
    ];
    // One batch completes; a second is still in flight when the server is killed.
    await Promise.all(batch(0));
    const inFlight = batch(1);
    await new Promise((done) => setTimeout(done, 15));
    await killServer(child);
    await Promise.all(inFlight);
  }
  expect(presets.length).toBeGreaterThanOrEqual(CYCLES * WRITES_PER_CYCLE);
  expect(orders.length).toBeGreaterThanOrEqual(CYCLES * ORDERS_PER_CYCLE);
}

describe.skipIf(!TEST_DATABASE_URL)('acknowledged writes survive kill -9', () => {
  it('on PGlite in DATA_DIR', async () => {
    const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-durable-'));
    cleanups.push(() => rm(dataDir, { recursive: true, force: true }));
    // The first start migrates and seeds the empty data directory.
    await crashCycles({ DATA_DIR: dataDir });
  }, 1_800_000);

  it('on PostgreSQL', async () => {
    const name = await createDatabaseFrom(inject('pgSeededTemplate'));
    const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-durable-pg-'));
    cleanups.push(async () => {
      await dropDatabase(name);
      await rm(dataDir, { recursive: true, force: true });
    });
    await crashCycles({ DATABASE_URL: databaseUrl(name), DATA_DIR: dataDir });
  }, 1_800_000);
});
