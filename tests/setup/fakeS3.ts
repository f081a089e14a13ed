/**
 * A local S3-compatible server for tests (s3rver from npm, started and stopped by the test) with one bucket, and
 * the S3_ settings that point the app at it.
 */
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import S3rver from 's3rver';
import type { Env } from '../../server/env';

/** A running fake S3 server. */
export interface FakeS3 {
  /** The S3_ environment settings that reach it. */
  env: Pick<Env, 'S3_ENDPOINT' | 'S3_BUCKET' | 'S3_REGION' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY'>;
  /** The folder where it keeps objects. */
  directory: string;
  close(): Promise<void>;
}

/**
 * Starts s3rver on a free port with the bucket `nestwright-test`; the credentials are s3rver's documented defaults.
 */
export async function startFakeS3(): Promise<FakeS3> {
  const directory = await mkdtemp(join(tmpdir(), 'nestwright-s3-'));
  const server = new S3rver({
    address: '127.0.0.1',
    port: 0,
    silent: true,
    directory,
    configureBuckets: [{ name: 'nestwright-test', configs: [] }],
  });
  const { port } = (await server.run()) as { port: number };
  return {
    directory,
    env: {
      S3_ENDPOINT: `http://127.0.0.1:${port}`,
      S3_BUCKET: 'nestwright-test',
      S3_REGION: 'us-east-1',
      S3_ACCESS_KEY_ID: 'S3RVER',
      S3_SECRET_ACCESS_KEY: 'S3RVER',
    },
    async close() {
      await server.close();
      await rm(directory, { recursive: true, force: true });
    },
  };
}
