/**
 * PostgreSQL databases for the benches that run on a server (`BENCH_DATABASE_URL`, or `TEST_DATABASE_URL`; a role
 * that may create databases, e.g. the one `bash .ci/postgres.sh` prints): made for one run and dropped after it.
 */
import pg from 'pg';

/** The PostgreSQL URL the benches use, or undefined when none is set. */
export function benchDatabaseBase(): string | undefined {
  return process.env.BENCH_DATABASE_URL || process.env.TEST_DATABASE_URL || undefined;
}

/**
 * The URL of another database on the same server.
 * @param base - a URL on the server
 * @param database - database name
 */
export function urlFor(base: string, database: string): string {
  const url = new URL(base);
  url.pathname = `/${database}`;
  return url.toString();
}

/**
 * Runs one statement on the database of `base` (create and drop database; names are generated, never input).
 * @param base - a URL on the server
 * @param statement - SQL without parameters
 */
export async function adminSql(base: string, statement: string): Promise<void> {
  const client = new pg.Client({ connectionString: base, application_name: 'nestwright bench' });
  await client.connect();
  try {
    await client.query(statement);
  } finally {
    await client.end();
  }
}
