/**
 * `npm run cli -- user:create --email E --role R [--role R2] [--name N] [--password P]`: adds a person to the
 * database in DATA_DIR (migrating and seeding a new database first). Without --password a random one is generated
 * and printed once.
 */
import { randomBytes } from 'node:crypto';
import { PersonCreateSchema, ROLES } from '../../../shared/schemas/auth';
import { migrateDatabase, openDatabase } from '../../db/client';
import { seedIfNew } from '../../db/seed';
import { loadEnv } from '../../env';
import { HttpError } from '../../http/HttpError';
import { createPerson } from '../../services/people';
import { EXIT_CODE, parseCliArgs } from '../parseCliArgs';

/** One line for `npm run cli -- --help`. */
export const summary = 'Add a person: --email E --role R [--role R2] [--name N] [--password P]';

const USAGE = `Usage: npm run cli -- user:create --email E --role R [--role R2] [--name N] [--password P]
  --role     one of ${ROLES.join(', ')}; repeat for several
  --name     display name (default: the part of the e-mail before @)
  --password at least 10 characters; omitted = a random password, printed once
The database is the one in DATA_DIR (default ./data).`;

/**
 * Runs the command.
 * @param argv - arguments after `user:create`
 * @returns exit code: 0 created, 1 refused (e-mail in use), 2 bad arguments
 */
export async function run(argv: string[]): Promise<number> {
  const values = parseCliArgs(
    {
      args: argv,
      options: {
        email: { type: 'string' },
        role: { type: 'string', multiple: true },
        name: { type: 'string' },
        password: { type: 'string' },
        help: { type: 'boolean', short: 'h' },
      },
      strict: true,
    },
    `\n${USAGE}\n`,
  );
  if (!values) return EXIT_CODE.usage;
  if (values.help) {
    process.stdout.write(`${USAGE}\n`);
    return EXIT_CODE.ok;
  }
  const generated = values.password === undefined;
  const password = values.password ?? randomBytes(12).toString('base64url');
  const parsed = PersonCreateSchema.safeParse({
    email: values.email ?? '',
    name: values.name ?? (values.email ?? '').split('@')[0],
    roles: values.role ?? [],
    password,
  });
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${issue.path.join('.') || 'input'}: ${issue.message}`);
    process.stderr.write(`Cannot create the person:\n${lines.join('\n')}\n\n${USAGE}\n`);
    return EXIT_CODE.usage;
  }

  const env = loadEnv();
  const { pg, db } = await openDatabase({ dataDir: env.DATA_DIR });
  try {
    await migrateDatabase(db);
    await seedIfNew(db, env, () => {});
    const person = await createPerson(db, parsed.data, null);
    process.stdout.write(`Created ${person.name} <${person.email}> with roles ${person.roles.join(', ')}.\n`);
    if (generated) process.stdout.write(`Password (shown once, store it safely): ${password}\n`);
    return EXIT_CODE.ok;
  } catch (err) {
    if (err instanceof HttpError) {
      process.stderr.write(`${err.message}\n`);
      return EXIT_CODE.refused;
    }
    throw err;
  } finally {
    await pg.close();
  }
}
