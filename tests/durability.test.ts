/**
 * Losing nothing: 10 cycles of concurrent preset writes through the API, then `kill -9` of the server while writes
 * are still in flight, then a restart. Every write the server acknowledged (201) before it died must be there after
 * the restart. On PGlite (DATA_DIR) always; on PostgreSQL too when TEST_DATABASE_URL is set.
 * An acknowledged write surviving a crash is the durability property of ACID transactions (common practice, no
 * source).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { afterAll, describe, expect, it, inject } from 'vitest';
import { openDatabase } from '../server/db/client';
import { DEMO_PASSWORD } from '../server/db/seedDemo';
import { createDatabaseFrom, databaseUrl, dropDatabase, TEST_DATABASE_URL } from './setup/postgresTestDb';
import { loadSnapshot } from './setup/testApp';

const ROOT = resolve(import.meta.dirname, '..');
const CYCLES = 10;
const WRITES_PER_CYCLE = 12;
const cleanups: Array<() => Promise<void>> = [];
let running: ChildProcess | undefined;

afterAll(async () => {
  if (running?.exitCode === null) running.kill('SIGKILL');
  for (const cleanup of cleanups) await cleanup();
});

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
  const { port } = server.address() as { port: number };
  await new Promise<void>((done) => server.close(() => done()));
  return port;
}

/** Starts the production entry and resolves with its address once it is ready. */
function startServer(env: Record<string, string>): Promise<string> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    cwd: ROOT,
    env: { ...process.env, NODE_ENV: 'test', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  running = child;
  let output = '';
  return new Promise((done, fail) => {
    const timer = setTimeout(() => fail(new Error(`the server did not start:\n${output}`)), 180_000);
    child.stdout!.on('data', (chunk: Buffer) => {
      output += chunk.toString();
      const ready = /Nestwright is ready at (\S+)/.exec(output);
      if (ready) {
        clearTimeout(timer);
        done(ready[1]);
      }
    });
    child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString()));
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      if (signal !== 'SIGKILL') fail(new Error(`the server exited with ${code}:\n${output}`));
    });
  });
}

/** Kills the running server with SIGKILL and waits until it is gone. */
async function killServer(): Promise<void> {
  const child = running!;
  if (child.exitCode !== null || child.signalCode !== null) return;
  const gone = new Promise((done) => child.once('exit', done));
  child.kill('SIGKILL');
  await gone;
}

async function signIn(base: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { Origin: base, 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'maren@fernhollow.test', password: DEMO_PASSWORD }),
  });
  expect(res.status).toBe(200);
  return res.headers
    .getSetCookie()
    .map((line) => line.split(';')[0])
    .join('; ');
}

/** Runs the crash cycles against one server configuration. */
async function crashCycles(env: Record<string, string>): Promise<void> {
  const acknowledged: string[] = [];
  for (let cycle = 0; cycle <= CYCLES; cycle++) {
    const base = await startServer({ ...env, PORT: String(await freePort()) });
    const cookie = await signIn(base);
    const headers = { Origin: base, 'Content-Type': 'application/json', Cookie: cookie };
    // Everything acknowledged before any earlier crash is still there.
    for (const id of acknowledged) {
      const res = await fetch(`${base}/api/presets/${id}`, { headers });
      expect(res.status, `preset ${id} acknowledged before a crash`).toBe(200);
    }
    if (cycle === CYCLES) {
      await killServer();
      break;
    }
    const write = (n: number) =>
      fetch(`${base}/api/presets`, {
        method: 'POST',
        headers,
        body: JSON.stringify({ templateId: 'gable-box', name: `Crash ${cycle}-${n}-${Date.now()}`, params: {} }),
      }).then(
        async (res) => {
          if (res.status === 201) acknowledged.push(((await res.json()) as { id: string }).id);
        },
        () => {}, // cut off by the kill: not acknowledged
      );
    // One batch completes; a second is still in flight when the server is killed.
    await Promise.all(Array.from({ length: WRITES_PER_CYCLE }, (_, n) => write(n)));
    const inFlight = Array.from({ length: WRITES_PER_CYCLE }, (_, n) => write(WRITES_PER_CYCLE + n));
    await new Promise((done) => setTimeout(done, 15));
    await killServer();
    await Promise.all(inFlight);
  }
  expect(acknowledged.length).toBeGreaterThanOrEqual(CYCLES * WRITES_PER_CYCLE);
}

describe('acknowledged writes survive kill -9', () => {
  it.skipIf(TEST_DATABASE_URL)(
    'on PGlite in DATA_DIR',
    async () => {
      const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-durable-'));
      cleanups.push(() => rm(dataDir, { recursive: true, force: true }));
      const { pg } = await openDatabase({ dataDir, loadDataDir: await loadSnapshot('seeded') });
      await pg.close();
      await crashCycles({ DATA_DIR: dataDir });
    },
    900_000,
  );

  it.skipIf(!TEST_DATABASE_URL)(
    'on PostgreSQL',
    async () => {
      const name = await createDatabaseFrom(inject('pgSeededTemplate'));
      const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-durable-pg-'));
      cleanups.push(async () => {
        await dropDatabase(name);
        await rm(dataDir, { recursive: true, force: true });
      });
      await crashCycles({ DATABASE_URL: databaseUrl(name), DATA_DIR: dataDir });
    },
    900_000,
  );
});
