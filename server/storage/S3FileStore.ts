/**
 * {@link FileStore} on S3-compatible object storage through `@aws-sdk/client-s3` (path-style addressing, so it works
 * with any endpoint, not only virtual-hosted buckets). Downloads stream straight from the object body.
 */
import type { Readable } from 'node:stream';
import {
  DeleteObjectCommand,
  GetObjectCommand,
  PutObjectCommand,
  S3Client,
  S3ServiceException,
} from '@aws-sdk/client-s3';
import { readAll, type FileStore, type StoredFile } from './FileStore';

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
  private readonly client: S3Client;

  /** @param options - endpoint, bucket and credentials */
  constructor(private readonly options: S3FileStoreOptions) {
    this.client = new S3Client({
      endpoint: options.endpoint,
      region: options.region,
      forcePathStyle: true,
      credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
    });
  }

  async put(key: string, bytes: Uint8Array, contentType: string): Promise<void> {
    await this.client.send(
      new PutObjectCommand({ Bucket: this.options.bucket, Key: key, Body: bytes, ContentType: contentType }),
    );
  }

  async open(key: string): Promise<StoredFile | null> {
    try {
      const object = await this.client.send(new GetObjectCommand({ Bucket: this.options.bucket, Key: key }));
      return {
        body: object.Body as Readable,
        sizeBytes: object.ContentLength ?? 0,
        contentType: object.ContentType ?? 'application/octet-stream',
      };
    } catch (err) {
      if (isMissing(err)) return null;
      throw err;
    }
  }

  async read(key: string): Promise<Buffer | null> {
    const file = await this.open(key);
    return file ? readAll(file.body) : null;
  }

  async remove(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.options.bucket, Key: key }));
  }

  /** Closes the client's connections. */
  close(): void {
    this.client.destroy();
  }
}

function isMissing(err: unknown): boolean {
  return (
    err instanceof S3ServiceException &&
    (err.name === 'NoSuchKey' || err.name === 'NotFound' || err.$metadata.httpStatusCode === 404)
  );
}
