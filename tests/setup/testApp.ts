/**
 * `makeTestApp()`: the real app over a private copy of the migrated + seeded snapshot from ./global.ts, with
 * supertest agents already signed in as the demo person of each role.
 */
import { readFile } from 'node:fs/promises';
import type { Express } from 'express';
import supertest from 'supertest';
import { afterAll, beforeAll, inject } from 'vitest';
import type { Role } from '../../shared/schemas/auth';
import { createApp } from '../../server/app';
import { createContext, type AppContext } from '../../server/context';
import { openDatabase, openPostgres, pgliteClient, type Db, type SqlClient } from '../../server/db/client';
import { createDatabaseFrom, databaseUrl, dropDatabase, TEST_DATABASE_URL } from './postgresTestDb';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../../server/db/seedDemo';
import { EnvSchema, type Env } from '../../server/env';

/** The origin test requests come from (PUBLIC_ORIGIN of the test app). */
export const TEST_ORIGIN = 'http://nestwright.test';

/** A supertest agent (keeps cookies between requests). */
export type TestAgent = ReturnType<typeof supertest.agent>;

/** What {@link makeTestApp} returns. */
export interface TestApp {
  app: Express;
  ctx: AppContext;
  /**
   * A supertest agent with the Origin header set; signed in as the demo person holding `role`, or signed out for
   * null. Agents are cached per role; pass `{ fresh: true }` for a new session (e.g. to sign it out).
   */
  agent(role: Role | null, options?: { fresh?: boolean }): Promise<TestAgent>;
  /** Signs in a new agent with any e-mail and password. */
  signIn(email: string, password: string): Promise<TestAgent>;
  /** Lines the server logged (unexpected errors land here). */
  logs: string[];
  /** Stops the job queue and closes the database. */
  close(): Promise<void>;
}

const snapshots = new Map<'seeded' | 'migrated', Promise<Buffer>>();

/**
 * A database snapshot made once per test run by ./global.ts.
 * @param kind - `seeded` (demo data in) or `migrated` (a new database that was never seeded)
 */
export async function loadSnapshot(kind: 'seeded' | 'migrated' = 'seeded'): Promise<Blob> {
  let bytes = snapshots.get(kind);
  if (!bytes) {
    bytes = readFile(inject(kind === 'seeded' ? 'pgSnapshotPath' : 'pgMigratedSnapshotPath'));
    snapshots.set(kind, bytes);
  }
  return new Blob([new Uint8Array(await bytes)]);
}

/**
 * A private database for one test: a copy of the seeded (or only migrated) PGlite snapshot, or on PostgreSQL
 * (TEST_DATABASE_URL) a new database copied from the template; `drop` removes it after closing.
 * @param kind - `seeded` or `migrated`
 */
export async function openTestDatabase(
  kind: 'seeded' | 'migrated' = 'seeded',
): Promise<{ pg: SqlClient; db: Db; drop: () => Promise<void> }> {
  if (TEST_DATABASE_URL) {
    const name = await createDatabaseFrom(inject(kind === 'seeded' ? 'pgSeededTemplate' : 'pgMigratedTemplate'));
    const { pg, db } = openPostgres({ url: databaseUrl(name), poolMax: 4, statementTimeoutMs: 0 });
    return { pg, db, drop: () => dropDatabase(name) };
  }
  const { pg, db } = await openDatabase({ loadDataDir: await loadSnapshot(kind) });
  return { pg: pgliteClient(pg), db, drop: async () => {} };
}

/**
 * A fresh app on its own copy of the seeded database (about a second).
 * @param envOverrides - environment settings for this app (PUBLIC_ORIGIN defaults to {@link TEST_ORIGIN})
 */
export async function makeTestApp(envOverrides: Partial<Env> = {}): Promise<TestApp> {
  const { pg, db, drop } = await openTestDatabase('seeded');
  const env: Env = { ...EnvSchema.parse({ NODE_ENV: 'test', PUBLIC_ORIGIN: TEST_ORIGIN }), ...envOverrides };
  const logs: string[] = [];
  const ctx = createContext({ db, pg, env, log: (line) => logs.push(line) });
  const app = createApp(ctx);
  const agents = new Map<Role | null, TestAgent>();

  const newAgent = (): TestAgent => supertest.agent(app).set('Origin', TEST_ORIGIN);
  const signIn = async (email: string, password: string): Promise<TestAgent> => {
    const agent = newAgent();
    const res = await agent.post('/api/auth/sign-in').send({ email, password });
    if (res.status !== 200) throw new Error(`Sign-in as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return agent;
  };

  return {
    app,
    ctx,
    logs,
    signIn,
    async agent(role, options = {}) {
      const cached = agents.get(role);
      if (cached && !options.fresh) return cached;
      let agent: TestAgent;
      if (role === null) agent = newAgent();
      else {
        const person = DEMO_PEOPLE.find((candidate) => candidate.roles.includes(role));
        if (!person) throw new Error(`No demo person holds ${role}`);
        agent = await signIn(person.email, DEMO_PASSWORD);
      }
      if (!options.fresh) agents.set(role, agent);
      return agent;
    },
    async close() {
      await ctx.jobs.stop();
      await pg.close();
      await drop();
    },
  };
}

/**
 * One test app for the whole file: started before its tests and closed after them (it registers `beforeAll` and
 * `afterAll`; hooks the file registers later run after the start and before the close).
 * @param envOverrides - as for {@link makeTestApp}
 * @returns the app; read it inside tests and hooks, not while the file is being collected
 */
export function useTestApp(envOverrides: Partial<Env> = {}): TestApp {
  let started: TestApp | null = null;
  beforeAll(async () => {
    started = await makeTestApp(envOverrides);
  });
  afterAll(async () => {
    await started?.close();
  });
  return new Proxy({} as TestApp, {
    get(_target, key) {
      if (!started) throw new Error('The test app starts in beforeAll: use it inside a test or a hook.');
      return Reflect.get(started, key) as unknown;
    },
  });
}
