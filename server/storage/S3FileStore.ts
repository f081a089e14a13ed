/**
 * {@link FileStore} on S3-compatible object storage through `@aws-sdk/client-s3` (path-style addressing, so it works
 * with any endpoint, not only virtual-hosted buckets). Downloads stream straight from the object body.
 * The SDK is loaded when a store is made, not when the server starts: loading it takes about half a second of CPU,
 * which a server keeping its files in DATA_DIR never needs.
 */
import type { Readable } from 'node:stream';
import type { S3Client } from '@aws-sdk/client-s3';
import { readAll, type FileStore, type StoredFile } from './FileStore';

/** The SDK module. */
type S3Sdk = typeof import('@aws-sdk/client-s3');

/** Where the bucket is and how to sign requests. */
export interface S3FileStoreOptions {
  /** e.g. `http://127.0.0.1:9000` */
  endpoint: string;
  bucket: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
}

/** Objects in one bucket; see the file comment. */
export class S3FileStore implements FileStore {
  readonly kind = 's3' as const;
  private readonly loaded: Promise<{ sdk: S3Sdk; client: S3Client }>;
  private client?: S3Client;

  /** @param options - endpoint, bucket and credentials */
  constructor(private readonly options: S3FileStoreOptions) {
    this.loaded = import('@aws-sdk/client-s3').then((sdk) => {
      this.client = new sdk.S3Client({
        endpoint: options.endpoint,
        region: options.region,
        forcePathStyle: true,
        credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
      });
      return { sdk, client: this.client };
    });
    // A failure to load shows on the first use; it must not end the process before.
    this.loaded.catch(() => {});
  }

  async put(key: string, bytes: Uint8Array, contentType: string): Promise<void> {
    const { sdk, client } = await this.loaded;
    await client.send(
      new sdk.PutObjectCommand({ Bucket: this.options.bucket, Key: key, Body: bytes, ContentType: contentType }),
    );
  }

  async open(key: string): Promise<StoredFile | null> {
    const { sdk, client } = await this.loaded;
    try {
      const object = await client.send(new sdk.GetObjectCommand({ Bucket: this.options.bucket, Key: key }));
      return {
        body: object.Body as Readable,
        sizeBytes: object.ContentLength ?? 0,
        contentType: object.ContentType ?? 'application/octet-stream',
      };
    } catch (err) {
      if (isMissing(sdk, err)) return null;
      throw err;
    }
  }

  async read(key: string): Promise<Buffer | null> {
    const file = await this.open(key);
    return file ? readAll(file.body) : null;
  }

  async remove(key: string): Promise<void> {
    const { sdk, client } = await this.loaded;
    await client.send(new sdk.DeleteObjectCommand({ Bucket: this.options.bucket, Key: key }));
  }

  /** Closes the client's connections (once the SDK has loaded, if it is still loading). */
  close(): void {
    if (this.client) this.client.destroy();
    else
      void this.loaded.then(
        ({ client }) => client.destroy(),
        () => {},
      );
  }
}

function isMissing(sdk: S3Sdk, err: unknown): boolean {
  return (
    err instanceof sdk.S3ServiceException &&
    (err.name === 'NoSuchKey' || err.name === 'NotFound' || err.$metadata.httpStatusCode === 404)
  );
}
