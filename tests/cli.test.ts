/**
 * `npm run cli -- user:create`: run as a real process against a data directory, as an operator would.
 */
import { execFile } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { promisify } from 'node:util';
import { eq } from 'drizzle-orm';
import { afterAll, describe, expect, it } from 'vitest';
import { verifyPassword } from '../server/auth/password';
import { openDatabase } from '../server/db/client';
import { auditEvents, people } from '../server/db/schema';
import { loadSnapshot } from './setup/testApp';

const root = resolve(import.meta.dirname, '..');
const run = promisify(execFile);
const dirs: string[] = [];
afterAll(async () => {
  await Promise.all(dirs.map((dir) => rm(dir, { recursive: true, force: true })));
});

/** Runs the CLI; resolves with the exit code and output instead of throwing on a non-zero exit. */
async function cli(args: string[], dataDir: string): Promise<{ code: number; stdout: string; stderr: string }> {
  try {
    const { stdout, stderr } = await run(process.execPath, ['--import', 'tsx', 'server/cli/index.ts', ...args], {
      cwd: root,
      env: { ...process.env, DATA_DIR: dataDir, NODE_ENV: 'test' },
    });
    return { code: 0, stdout, stderr };
  } catch (err) {
    const failed = err as { code: number; stdout: string; stderr: string };
    return { code: failed.code, stdout: failed.stdout, stderr: failed.stderr };
  }
}

describe('cli user:create', () => {
  it(
    'adds a person with a generated password, printed once, and refuses the same e-mail again',
    { timeout: 180_000 },
    async () => {
      const dataDir = await mkdtemp(join(tmpdir(), 'nestwright-cli-'));
      dirs.push(dataDir);
      const seeded = await openDatabase({ dataDir, loadDataDir: await loadSnapshot('seeded') });
      await seeded.pg.close();

      const created = await cli(
        [
          'user:create',
          '--email',
          'Rowan@Fernhollow.test',
          '--role',
          'designer',
          '--role',
          'sales',
          '--name',
          'Rowan Pike',
        ],
        dataDir,
      );
      expect(created.code, created.stderr).toBe(0);
      expect(created.stdout).toMatch(/Created Rowan Pike <rowan@fernhollow\.test> with roles designer, sales/);
      const password = /Password \(shown once[^)]*\): (\S+)/.exec(created.stdout)?.[1];
      expect(password?.length).toBeGreaterThanOrEqual(10);

      const again = await cli(['user:create', '--email', 'rowan@fernhollow.test', '--role', 'admin'], dataDir);
      expect(again.code).toBe(1);
      expect(again.stderr).toMatch(/already in use/);

      const { pg, db } = await openDatabase({ dataDir });
      try {
        const [row] = await db.select().from(people).where(eq(people.email, 'rowan@fernhollow.test'));
        expect(row.roles).toEqual(['designer', 'sales']);
        expect(row.name).toBe('Rowan Pike');
        expect(await verifyPassword(row.passwordHash, password!)).toBe(true);
        const events = await db
          .select()
          .from(auditEvents)
          .where(eq(auditEvents.subject, `person:${row.id}`));
        expect(events.map((event) => [event.action, event.actorId])).toEqual([['person.created', null]]);
      } finally {
        await pg.close();
      }
    },
  );

  it('refuses an unknown role and a bad e-mail with exit code 2, naming the fields', { timeout: 60_000 }, async () => {
    const result = await cli(
      ['user:create', '--email', 'not-an-email', '--role', 'gardener'],
      join(tmpdir(), 'unused'),
    );
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/roles\.0: /);
    expect(result.stderr).toMatch(/email: /);
  });
});
