/**
 * The shared set-up of the sales tests (price list, quotes, spec sheets): one test app per file with the fixture
 * family published in its database, closed after the file.
 */
import { afterAll, beforeAll } from 'vitest';
import { ensureSalesFixture, type SalesFixture } from '../salesFixtures';
import { makeTestApp, type TestApp } from './testApp';

/** The app and fixture of one test file, filled in by its `beforeAll`. */
export interface SalesTestApp {
  /** The test app (agents, context). */
  t: TestApp;
  /** The published fixture family. */
  fixture: SalesFixture;
}

/**
 * Registers `beforeAll` (make the test app, publish the fixture family) and `afterAll` (close the app) in the calling
 * test file. Read the returned object's fields inside tests, not at module level.
 */
export function useSalesTestApp(): SalesTestApp {
  const suite = {} as SalesTestApp;
  beforeAll(async () => {
    suite.t = await makeTestApp();
    suite.fixture = await ensureSalesFixture(suite.t.ctx.db);
  });
  afterAll(async () => {
    await suite.t?.close();
  });
  return suite;
}

/**
 * A supertest parser that reads a binary body into a Buffer (use with `.buffer(true).parse(binaryBody)`).
 * @param res - the response stream
 * @param done - receives the body
 */
export function binaryBody(res: unknown, done: (err: Error | null, body: Buffer) => void): void {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
}
