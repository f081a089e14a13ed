/**
 * The database: a new database is seeded once; a restart keeps everything and seeds nothing; the production defaults
 * are loaded; the schema refuses unknown roles. To stay fast, "new" databases start from the migrated-but-unseeded
 * snapshot of tests/setup/global.ts (creating a PGlite cluster takes seconds); global setup itself covers the
 * create + migrate path.
 */
import { count, eq } from 'drizzle-orm';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS } from '../shared/production/defaults';
import { boot } from '../server/boot';
import { openDatabase } from '../server/db/client';
import { seedIfNew } from '../server/db/seed';
import { materials, people, printerProfiles, seedRuns, studios } from '../server/db/schema';
import { seedProduction } from '../server/db/seedProduction';
import { DEMO_PASSWORD, DEMO_PEOPLE, DEMO_STUDIO_NAME } from '../server/db/seedDemo';
import { EnvSchema } from '../server/env';
import { loadSnapshot, makeTestApp } from './setup/testApp';

const dirs: string[] = [];
afterAll(async () => {
  await Promise.all(dirs.map((dir) => rm(dir, { recursive: true, force: true })));
});

async function signIn(url: string, email: string, password: string): Promise<Response> {
  return fetch(`${url}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: url },
    body: JSON.stringify({ email, password }),
  });
}

/** A data directory holding a new (migrated, never seeded) database. */
async function newDataDir(): Promise<string> {
  const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-db-'));
  dirs.push(dataDir);
  const { pg } = await openDatabase({ dataDir, loadDataDir: await loadSnapshot('migrated') });
  await pg.close();
  return dataDir;
}

describe('data directory', () => {
  it('seeds a new database once, and a restart keeps people, sessions and changes', { timeout: 120_000 }, async () => {
    const dataDir = await newDataDir();
    const env = EnvSchema.parse({ NODE_ENV: 'test', DATA_DIR: dataDir });
    const logs: string[] = [];

    const first = await boot({ dataDir, port: 0, env, log: (line) => logs.push(line) });
    expect(logs.join('\n')).toMatch(/new database seeded/);
    const signedIn = await signIn(first.url, 'joss@fernhollow.test', DEMO_PASSWORD);
    expect(signedIn.status).toBe(200);
    const cookie = signedIn.headers.get('set-cookie')!.split(';')[0];
    const added = await fetch(`${first.url}/api/people`, {
      method: 'POST',
      headers: { 'Content-Type': 'application/json', Origin: first.url, Cookie: cookie },
      body: JSON.stringify({
        email: 'kept@fernhollow.test',
        name: 'Kept Person',
        roles: ['sales'],
        password: 'kept-password',
      }),
    });
    expect(added.status).toBe(201);
    await first.close();

    logs.length = 0;
    const second = await boot({ dataDir, port: 0, env, log: (line) => logs.push(line) });
    try {
      expect(logs.join('\n')).toMatch(/existing database kept/);
      const me = await fetch(`${second.url}/api/auth/me`, { headers: { Cookie: cookie } });
      expect(me.status).toBe(200);
      expect((await signIn(second.url, 'kept@fernhollow.test', 'kept-password')).status).toBe(200);
      const [{ value: studioCount }] = await second.ctx.db.select({ value: count() }).from(studios);
      expect(studioCount).toBe(1);
      const [{ value: peopleCount }] = await second.ctx.db.select({ value: count() }).from(people);
      expect(peopleCount).toBe(DEMO_PEOPLE.length + 1);
    } finally {
      await second.close();
    }
  });

  it('with SEED_DEMO=false a new database gets the production defaults but no demo people', async () => {
    const { pg, db } = await openDatabase({ loadDataDir: await loadSnapshot('migrated') });
    try {
      expect(await seedIfNew(db, { SEED_DEMO: false }, () => {})).toEqual(['production-defaults']);
      const [{ value: peopleCount }] = await db.select({ value: count() }).from(people);
      expect(peopleCount).toBe(0);
      const [{ value: printerCount }] = await db.select({ value: count() }).from(printerProfiles);
      expect(printerCount).toBe(DEFAULT_PRINTERS.length);
      // and it is not new any more
      expect(await seedIfNew(db, { SEED_DEMO: true }, () => {})).toEqual([]);
    } finally {
      await pg.close();
    }
  });
});

describe('seeded snapshot', () => {
  it('holds the demo studio, one person per role, the production defaults, and the seed record', async () => {
    const t = await makeTestApp();
    try {
      const [studio] = await t.ctx.db.select().from(studios);
      expect(studio.name).toBe(DEMO_STUDIO_NAME);
      const rows = await t.ctx.db.select().from(people);
      expect(rows.map((row) => row.email).sort()).toEqual(DEMO_PEOPLE.map((person) => person.email).sort());
      expect(rows.every((row) => row.passwordHash.startsWith('$argon2id$'))).toBe(true);
      expect((await t.ctx.db.select().from(materials)).map((row) => row.id).sort()).toEqual(
        DEFAULT_MATERIALS.map((material) => material.id).sort(),
      );
      const [printer] = await t.ctx.db
        .select()
        .from(printerProfiles)
        .where(eq(printerProfiles.id, DEFAULT_PRINTERS[0].id));
      expect(printer.data).toEqual(JSON.parse(JSON.stringify(DEFAULT_PRINTERS[0])));
      const ran = (await t.ctx.db.select().from(seedRuns)).map((row) => row.name);
      expect(ran).toEqual(
        expect.arrayContaining(['production-defaults', 'demo-studio-and-people', 'seeding-complete']),
      );
      // seeding the defaults again adds nothing
      expect(await seedProduction(t.ctx.db)).toEqual({ printers: 0, materials: 0 });
    } finally {
      await t.close();
    }
  });

  it('refuses an unknown role or no role at the database level too', async () => {
    const t = await makeTestApp();
    try {
      for (const roles of ['{owner}', '{}']) {
        await expect(
          t.ctx.pg.query(`update people set roles = $1 where email = 'ada@fernhollow.test'`, [roles]),
        ).rejects.toThrow(/people_roles_known/);
      }
    } finally {
      await t.close();
    }
  });
});
