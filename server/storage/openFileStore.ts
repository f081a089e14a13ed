/** Chooses the file store from the environment: S3-compatible storage when S3_ENDPOINT is set, else a local folder. */
import { join, resolve } from 'node:path';
import type { Env } from '../env';
import type { FileStore } from './FileStore';
import { LocalFileStore } from './LocalFileStore';
import { S3FileStore } from './S3FileStore';

/**
 * The store for an environment: `S3FileStore` with S3_ENDPOINT (then S3_BUCKET and the keys must be set too), otherwise
 * `LocalFileStore` on DATA_DIR/uploads (where photos have always been kept).
 * @param env - the parsed environment
 */
export function openFileStore(
  env: Pick<Env, 'DATA_DIR' | 'S3_ENDPOINT' | 'S3_BUCKET' | 'S3_REGION' | 'S3_ACCESS_KEY_ID' | 'S3_SECRET_ACCESS_KEY'>,
): FileStore {
  if (env.S3_ENDPOINT) {
    if (!env.S3_BUCKET || !env.S3_ACCESS_KEY_ID || !env.S3_SECRET_ACCESS_KEY)
      throw new Error('S3_ENDPOINT is set: S3_BUCKET, S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY are needed too.');
    return new S3FileStore({
      endpoint: env.S3_ENDPOINT,
      bucket: env.S3_BUCKET,
      region: env.S3_REGION,
      accessKeyId: env.S3_ACCESS_KEY_ID,
      secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    });
  }
  return new LocalFileStore(join(resolve(env.DATA_DIR), 'uploads'));
}
