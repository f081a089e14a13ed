/**
 * Crash safety of the dispatch outbox, with real processes and kill -9: a process that pays an order and dies
 * before dispatching loses nothing (the row was written with the payment); the restarted server sends it, and the
 * farm holds exactly one work order for it, also after the server is killed and restarted once more.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, inject, it } from 'vitest';

const SECRET = 'crash-test-notice-secret-123456';
const KEY = 'crash-test-key';
const children: ChildProcess[] = [];
let dataDir = '';

function start(
  script: string,
  env: Record<string, string>,
): { child: ChildProcess; line: (re: RegExp) => Promise<string> } {
  const child = spawn(process.execPath, ['--import', 'tsx', script], {
    env: { ...process.env, ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  let out = '';
  let err = '';
  child.stdout!.on('data', (chunk: Buffer) => (out += chunk.toString()));
  child.stderr!.on('data', (chunk: Buffer) => (err += chunk.toString()));
  const line = (re: RegExp) =>
    new Promise<string>((resolve, reject) => {
      const check = () => {
        const match = re.exec(out);
        if (match) return resolve(match[0]);
        if (child.exitCode !== null || child.signalCode !== null)
          return reject(new Error(`${script} exited ${child.exitCode}: ${err.slice(-2000)}`));
        setTimeout(check, 50);
      };
      check();
    });
  return { child, line };
}

async function kill9(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const exited = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGKILL');
  await exited;
}

async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise((resolve) => server.close(resolve));
  return port;
}

async function workOrders(farmUrl: string, reference: string): Promise<Array<{ id: string; stage: string }>> {
  const res = await fetch(`${farmUrl}/v1/work-orders?reference=${encodeURIComponent(reference)}`, {
    headers: { authorization: `Bearer ${KEY}` },
  });
  return ((await res.json()) as { workOrders: Array<{ id: string; stage: string }> }).workOrders;
}

afterAll(async () => {
  for (const child of children) await kill9(child);
  if (dataDir) await rm(dataDir, { recursive: true, force: true });
});

describe('crash between payment and dispatch', () => {
  it('loses nothing and sends the order exactly once after restarts', async () => {
    dataDir = await mkdtemp(join(tmpdir(), 'nestwright-crash-'));
    const appPort = await freePort();
    const farmEnv = { FARM_API_KEY: KEY, FARM_NOTICE_SECRET: SECRET, FARM_FAKE_SPEED: '20000' };
    const farm = start('server/farm/fakeFarmMain.ts', {
      ...farmEnv,
      FARM_FAKE_NOTICE_URL: `http://127.0.0.1:${appPort}/api/webhooks/farm`,
    });
    const farmUrl = (await farm.line(/http:\/\/127\.0\.0\.1:\d+/)).trim();

    // 1. Pay, then die before any dispatcher runs.
    const payer = start('tests/setup/crash/payThenHang.ts', {
      DATA_DIR: dataDir,
      SNAPSHOT_PATH: inject('pgSnapshotPath'),
    });
    const paid = await payer.line(/PAID \S+ \S+/);
    const reference = paid.split(' ')[2];
    await kill9(payer.child);
    expect(await workOrders(farmUrl, reference)).toEqual([]);

    // 2. Restart: the outbox row written with the payment is sent.
    const serverEnv = {
      ...farmEnv,
      DATA_DIR: dataDir,
      PORT: String(appPort),
      FARM_API_URL: farmUrl,
      FARM_POLL_MS: '100',
      FARM_RECONCILE_AFTER_S: '1',
    };
    const first = start('tests/setup/crash/serveFulfilment.ts', serverEnv);
    await first.line(/READY/);
    const sent = await waitFor(async () => {
      const list = await workOrders(farmUrl, reference);
      return list.length > 0 ? list : undefined;
    });
    expect(sent).toHaveLength(1);

    // 3. Kill the server while the farm works on it, restart: still exactly one work order, and it ships.
    await kill9(first.child);
    const second = start('tests/setup/crash/serveFulfilment.ts', serverEnv);
    await second.line(/READY/);
    const done = await waitFor(async () => {
      const list = await workOrders(farmUrl, reference);
      return list.every((w) => w.stage === 'handed_over') ? list : undefined;
    });
    expect(done).toHaveLength(1);
    expect(done[0].id).toBe(sent[0].id);
    await kill9(second.child);
    await kill9(farm.child);
  }, 180_000);
});

async function waitFor<T>(read: () => Promise<T | undefined>, limitMs = 60_000): Promise<T> {
  const stop = Date.now() + limitMs;
  for (;;) {
    const value = await read();
    if (value) return value;
    if (Date.now() > stop) throw new Error('gave up waiting');
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}
