/** Boots a server: opens the database (PGlite or PostgreSQL), migrates, seeds a new database, builds the app and listens. */
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Express } from 'express';
import { createApp } from './app';
import { createContext, type AppContext, type Log } from './context';
import { migrateDatabase, openConfiguredDatabase, withStartupLock } from './db/client';
import { openJobQueue } from './jobs/openJobQueue';
import { seedIfNew } from './db/seed';
import { startFamilyServices } from './services/familyServices';
import { startShopServices } from './services/shopServices';
import { loadEnv, type Env } from './env';
import { startFulfilment } from './farm/startFulfilment';

/** Options of {@link boot}. */
export interface BootOptions {
  /** DATA_DIR; undefined opens an in-memory database. */
  dataDir?: string;
  /** Port to listen on; 0 picks a free one. Defaults to env.PORT. */
  port?: number;
  /** Seed a new database (default true). */
  seed?: boolean;
  /** Progress lines (console.log by default). */
  log?: Log;
  /** The environment (parsed from process.env by default). */
  env?: Env;
  /** Built client to serve (dist/client); omitted = API only. */
  clientDir?: string;
  /** An HTTP server to answer on (dev mode shares it with Vite's hot-reload socket); a new one by default. */
  httpServer?: Server;
  /** Adds middleware after the API and before listening (dev mode mounts Vite here). */
  extend?: (app: Express, ctx: AppContext) => Promise<void> | void;
}

/** A running server. */
export interface Booted {
  /** `http://localhost:<port>` */
  url: string;
  ctx: AppContext;
  /** Stops listening and closes the database. */
  close(): Promise<void>;
}

/**
 * Opens the database, migrates, seeds a new database, builds the app and listens, logging the time of each stage.
 * @param options - see {@link BootOptions}
 */
export async function boot(options: BootOptions = {}): Promise<Booted> {
  const log = options.log ?? ((line: string) => console.log(line));
  const env = options.env ?? loadEnv();
  const stage = stopwatch(log);

  const { pg, db, url } = await openConfiguredDatabase(env, options.dataDir, 'nestwright api');
  stage(
    url
      ? `database opened (PostgreSQL at ${describeUrl(url)}, pool of ${env.DB_POOL_MAX})`
      : options.dataDir
        ? `database opened (${options.dataDir}/pg)`
        : 'database opened (in memory)',
  );
  // Several servers may start together on one PostgreSQL: one migrates and seeds while the others wait.
  const seeded = await withStartupLock(url, async () => {
    await migrateDatabase(db);
    stage('migrations applied');
    return (options.seed ?? true) ? seedIfNew(db, env, log) : null;
  });
  if (seeded) stage(seeded.length ? `new database seeded (${seeded.join(', ')})` : 'existing database kept');
  const ctx: AppContext = createContext({ db, pg, env, log, jobs: openJobQueue(env, () => ctx, 'nestwright api') });
  if (ctx.jobs.kind === 'pg-boss') {
    await ctx.jobs.start();
    stage(`job queue ready (pg-boss${env.JOBS_IN_API ? '' : '; jobs run in worker processes'})`);
  }
  await ctx.lucia.deleteExpiredSessions();

  const app = createApp(ctx, { clientDir: options.clientDir });
  await options.extend?.(app, ctx);
  const server = options.httpServer ?? createServer();
  server.on('request', app);
  try {
    await listen(server, options.port ?? env.PORT);
  } catch (err) {
    await ctx.jobs.stop();
    await pg.close();
    throw err;
  }
  const { port } = server.address() as AddressInfo;
  stage(`listening on port ${port}`);
  await startFamilyServices(ctx, server);
  await startFulfilment(ctx, server, `http://localhost:${port}`);
  await startShopServices(ctx, server);

  let closing: Promise<void> | undefined;
  return {
    url: `http://localhost:${port}`,
    ctx,
    close() {
      closing ??= (async () => {
        await new Promise<void>((resolve) => {
          server.close(() => resolve());
          server.closeAllConnections();
        });
        await ctx.jobs.stop();
        await pg.close();
      })();
      return closing;
    },
  };
}

function listen(server: Server, port: number): Promise<void> {
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, () => {
      server.off('error', reject);
      resolve();
    });
  });
}

/** Logs each stage with the milliseconds since the previous one. */
function stopwatch(log: Log): (label: string) => void {
  let last = performance.now();
  return (label) => {
    const now = performance.now();
    log(`  ${label} (${Math.round(now - last)} ms)`);
    last = now;
  };
}

/** A database URL without its password, for the log. @param url - the URL */
function describeUrl(url: string): string {
  const parsed = new URL(url);
  return `${parsed.hostname}:${parsed.port || 5432}${parsed.pathname}`;
}
