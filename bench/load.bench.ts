/**
 * `npm run bench -- load`: catalogue and storefront reads under load, side by side with a bare Express 5 server that
 * answers the same bytes, in the same run. Our server runs on PGlite with the demo data (a new DATA_DIR, seeded by its
 * first start); the bare server is a second process; autocannon runs here, a third process.
 * Targets: ours/bare ≥ 0.5 on catalogue and storefront reads, p99 ≤ 100 ms at 50 connections, and no errors at 100
 * connections for 60 s. `--quick` runs short loads for development; the reported figures come from the full run.
 * `--postgres` runs "ours" as two API processes on one PostgreSQL database instead (a new database on
 * BENCH_DATABASE_URL or TEST_DATABASE_URL, seeded by the first process and dropped at the end); autocannon spreads
 * its connections over both, and the CPU per answer counts both processes.
 */
import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import type { RecordedAnswer } from './lib/bareServer';
import { adminSql, benchDatabaseBase, urlFor } from './lib/benchDatabase';
import { recordAnswer } from './lib/recordAnswer';
import { runLoad, type LoadFigures, type LoadRequest } from './lib/runLoad';
import { REPO_ROOT, startServerProcess, type ServerProcess } from './lib/serverProcess';

/** What a browser sends on every read. */
const BROWSER_HEADERS = { 'accept-encoding': 'gzip, deflate, br', accept: 'application/json' };

/** A sales person of the demo studio reads the catalogue. */
const DEMO_SALES = { email: 'ada@fernhollow.test', password: 'fernhollow-demo' };

/** A load scenario: a name, the requests each connection cycles through, connections and duration. */
interface Scenario {
  name: string;
  requests: LoadRequest[];
  connections: number;
  durationS: number;
}

/** Signs in and returns the session cookie (name=value). */
async function signIn(baseUrl: string): Promise<string> {
  const res = await fetch(new URL('/api/auth/sign-in', baseUrl), {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: baseUrl },
    body: JSON.stringify(DEMO_SALES),
  });
  const cookie = res.headers.get('set-cookie')?.split(';')[0];
  if (!res.ok || !cookie) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
  return cookie;
}

/** Starts the bare server on recorded answers and resolves with its URL and a stop function. */
function startBareServer(answersFile: string): Promise<{ url: string; pid: number; stop: () => void }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'bench/lib/bareServer.ts', answersFile], {
    cwd: REPO_ROOT,
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  return new Promise((resolve, reject) => {
    child.stdout.on('data', (chunk: Buffer) => {
      const ready = /bare server ready at (\S+)/.exec(chunk.toString('utf8'));
      if (ready) resolve({ url: ready[1], pid: child.pid ?? 0, stop: () => child.kill('SIGTERM') });
    });
    child.once('exit', (code) => reject(new Error(`bare server ended (${code})`)));
  });
}

const ms = (value: number): string => `${Math.round(value)} ms`.padStart(8);

function printRow(label: string, figures: LoadFigures): void {
  console.log(
    `  ${label.padEnd(5)} ${figures.reqPerS.toFixed(0).padStart(6)} req/s  p50 ${ms(figures.p50Ms)}  p99 ${ms(figures.p99Ms)}` +
      `  max ${ms(figures.maxMs)}  errors ${figures.errors} (timeouts ${figures.timeouts}, non-2xx ${figures.non2xx})` +
      `  CPU ${figures.cpuMsPerAnswer === null ? '?' : figures.cpuMsPerAnswer.toFixed(2)} ms/answer` +
      `  ${(figures.bytesPerAnswer / 1024).toFixed(1)} KB/answer  load ${figures.load1.toFixed(2)}`,
  );
}

/** Runs the bench and prints its figures. */
export default async function loadBench(): Promise<void> {
  const quick = process.argv.includes('--quick');
  const postgres = process.argv.includes('--postgres');
  const dataDir = mkdtempSync(join(tmpdir(), 'nestwright-bench-load-'));
  const port = Number(process.env.BENCH_PORT ?? 3391);
  console.log(
    `load average at start: ${loadavg()
      .map((v) => v.toFixed(2))
      .join(', ')}${quick ? ' (quick mode)' : ''}${postgres ? ' (PostgreSQL, two API processes)' : ''}`,
  );
  const stops: Array<() => unknown> = [];
  const apis: ServerProcess[] = [];
  try {
    if (postgres) {
      const base = benchDatabaseBase();
      if (!base)
        throw new Error('--postgres needs BENCH_DATABASE_URL (a role that may create databases; .ci/postgres.sh)');
      const database = `nwb_load_${process.pid}_${Date.now().toString(36)}`;
      await adminSql(base, `create database ${database}`);
      stops.push(() => adminSql(base, `drop database if exists ${database} with (force)`));
      const env = { DATABASE_URL: urlFor(base, database), SEED_DEMO: 'true' };
      console.log(`starting two API processes on PostgreSQL database ${database} (the first migrates and seeds)...`);
      // One after the other: the second finds the database migrated and seeded.
      for (const [i, apiPort] of [port, port + 1].entries()) {
        const api = await startServerProcess({ label: `api-${i + 1}`, dataDir, port: apiPort, env });
        apis.push(api);
        stops.push(() => api.stop());
        console.log(`  api-${i + 1} ready after ${(api.readyMs / 1000).toFixed(1)} s at ${api.url}`);
      }
    } else {
      console.log(`starting our server on PGlite in ${dataDir} (first start seeds the demo)...`);
      const api = await startServerProcess({ label: 'ours', dataDir, port, env: { SEED_DEMO: 'true' } });
      apis.push(api);
      stops.push(() => api.stop());
      console.log(`  ready after ${(api.readyMs / 1000).toFixed(1)} s at ${api.url}`);
    }
    const ours = apis[0];
    const cookie = await signIn(ours.url);
    const products = (await (await fetch(new URL('/api/shop/products', ours.url))).json()) as {
      products: Array<{ slug: string }>;
    };
    const slug = products.products[0]?.slug;
    if (!slug) throw new Error('the demo shop has no product');
    const catalogue: LoadRequest[] = [{ path: '/api/catalogue', headers: { cookie } }];
    const storefront: LoadRequest[] = [{ path: '/api/shop/products' }, { path: `/api/shop/products/${slug}` }];

    const answers: RecordedAnswer[] = [];
    for (const request of [...catalogue, ...storefront]) {
      const answer = await recordAnswer(ours.url, request.path, { ...BROWSER_HEADERS, ...request.headers });
      if (answer.status !== 200) throw new Error(`${request.path} answered ${answer.status}`);
      const bytes = Buffer.from(answer.bodyBase64, 'base64').length;
      console.log(
        `  ${request.path}: ${bytes} bytes (${answer.headers['content-encoding'] ?? 'not compressed'}` +
          `${answer.headers.etag ? ', with ETag' : ''})`,
      );
      answers.push(answer);
    }
    const answersFile = join(dataDir, 'answers.json');
    writeFileSync(answersFile, JSON.stringify(answers));
    const bare = await startBareServer(answersFile);
    stops.push(bare.stop);

    const shortS = quick ? 5 : 20;
    const scenarios: Scenario[] = [
      {
        name: 'catalogue reads (GET /api/catalogue as sales)',
        requests: catalogue,
        connections: 50,
        durationS: shortS,
      },
      { name: `storefront reads (products list + /${slug})`, requests: storefront, connections: 50, durationS: shortS },
      {
        name: 'mixed reads (catalogue + storefront)',
        requests: [...catalogue, ...storefront],
        connections: 100,
        durationS: quick ? 10 : 60,
      },
    ];
    const summary: string[] = [];
    for (const scenario of scenarios) {
      console.log(`\n${scenario.name}: ${scenario.connections} connections, ${scenario.durationS} s each`);
      const figures: Record<string, LoadFigures> = {};
      for (const [label, urls, pids] of [
        ['ours', apis.map((api) => api.url), apis.map((api) => api.child.pid ?? 0)],
        ['bare', [bare.url], [bare.pid]],
      ] as const) {
        // Warm-up (not counted): JIT, caches, connection set-up.
        await runLoad({
          baseUrls: [...urls],
          requests: scenario.requests,
          connections: 10,
          durationS: 2,
          headers: BROWSER_HEADERS,
        });
        figures[label] = await runLoad({
          baseUrls: [...urls],
          requests: scenario.requests,
          connections: scenario.connections,
          durationS: scenario.durationS,
          headers: BROWSER_HEADERS,
          serverPids: [...pids],
        });
        printRow(label, figures[label]);
      }
      const ratio = figures.ours.reqPerS / figures.bare.reqPerS;
      const cpuRatio =
        figures.ours.cpuMsPerAnswer && figures.bare.cpuMsPerAnswer
          ? figures.bare.cpuMsPerAnswer / figures.ours.cpuMsPerAnswer
          : null;
      const line =
        `${scenario.name.split(' (')[0]}, ${scenario.connections} conn: ratio ours/bare ${ratio.toFixed(2)}` +
        ` (target ≥ 0.5; by CPU per answer ${cpuRatio === null ? '?' : cpuRatio.toFixed(2)}), our p99 ${Math.round(figures.ours.p99Ms)} ms${scenario.connections === 50 ? ' (target ≤ 100)' : ''}` +
        `, our errors ${figures.ours.errors}${scenario.connections === 100 ? ' (target 0)' : ''}, load ${figures.ours.load1.toFixed(2)}`;
      console.log(`  ${line}`);
      summary.push(line);
    }
    console.log(
      `\nsummary${postgres ? ' (ours: two API processes on PostgreSQL)' : ''}${quick ? ' (quick mode: not the reported figures)' : ''}:`,
    );
    for (const line of summary) console.log(`  ${line}`);
  } finally {
    for (const stop of stops.reverse()) await stop();
    rmSync(dataDir, { recursive: true, force: true });
  }
}
