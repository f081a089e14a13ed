/**
 * Tests on PostgreSQL: with TEST_DATABASE_URL set (a role that may create databases), the global setup migrates and
 * seeds template databases once, and every test app gets its own database copied from a template
 * (`CREATE DATABASE ... TEMPLATE`), dropped when the app closes. Without it, tests run on PGlite snapshots.
 */
import { randomBytes } from 'node:crypto';
import pg from 'pg';

/** The PostgreSQL server tests run against, or undefined for PGlite. */
export const TEST_DATABASE_URL = process.env.TEST_DATABASE_URL || undefined;

/**
 * The URL of another database on the same server.
 * @param name - database name
 */
export function databaseUrl(name: string): string {
  const url = new URL(TEST_DATABASE_URL!);
  url.pathname = `/${name}`;
  return url.toString();
}

/**
 * Runs statements on the server's maintenance connection (the database of TEST_DATABASE_URL).
 * @param statements - SQL without parameters (database names are generated, never user input)
 */
export async function adminSql(...statements: string[]): Promise<void> {
  const client = new pg.Client({ connectionString: TEST_DATABASE_URL, application_name: 'nestwright tests' });
  await client.connect();
  try {
    for (const statement of statements) await client.query(statement);
  } finally {
    await client.end();
  }
}

/**
 * Creates a new database copied from a template and returns its name.
 * @param template - the template database
 */
export async function createDatabaseFrom(template: string): Promise<string> {
  const name = `nwt_${randomBytes(6).toString('hex')}`;
  // Copies serialise on the template; retry while another copy still holds it.
  for (let attempt = 1; ; attempt++) {
    try {
      await adminSql(`create database ${name} template ${template}`);
      return name;
    } catch (err) {
      if (attempt >= 20 || !/being accessed by other users/.test((err as Error).message)) throw err;
      await new Promise((resolve) => setTimeout(resolve, 100 * attempt));
    }
  }
}

/**
 * Drops a test database, closing whatever still connects to it.
 * @param name - the database
 */
export async function dropDatabase(name: string): Promise<void> {
  await adminSql(`drop database if exists ${name} with (force)`);
}
