/**
 * One storage interface for the files the product keeps: sample photos, print files and generated documents.
 * `LocalFileStore` (a folder under DATA_DIR, the default) and `S3FileStore` (S3-compatible object storage, chosen
 * with S3_ENDPOINT and S3_BUCKET) implement it; `ctx.files` is the store of a running app. Keys are relative paths
 * such as `photos/<random>.webp`; callers never build file-system paths or bucket URLs themselves.
 */
import type { Readable } from 'node:stream';

/** Top-level folders of keys, one per kind of file. */
export type FileArea = 'photos' | 'print-files' | 'documents';

/** A stored file opened for reading. */
export interface StoredFile {
  /** The bytes, streamed. */
  body: Readable;
  /** Size in bytes. */
  sizeBytes: number;
  /** The content type given when it was stored (local folder: from the key's extension). */
  contentType: string;
}

/** The file store of one app. */
export interface FileStore {
  /** `local` or `s3`. */
  readonly kind: 'local' | 's3';
  /**
   * Stores a file under a key, replacing any file there.
   * @param key - e.g. `photos/3f2a....webp`
   */
  put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
  /** Opens a file for streaming, or null when there is none under the key. */
  open(key: string): Promise<StoredFile | null>;
  /** Reads a whole file (small files: documents that embed it), or null when there is none. */
  read(key: string): Promise<Buffer | null>;
  /** Removes a file; no error when it is already gone. */
  remove(key: string): Promise<void>;
}

/**
 * A key in an area, refusing anything that could leave it (`..`, absolute paths, backslashes, empty parts).
 * @param area - the kind of file
 * @param name - the file name (or sub-path) inside the area
 */
export function fileKey(area: FileArea, name: string): string {
  if (!/^[A-Za-z0-9._-]+(\/[A-Za-z0-9._-]+)*$/.test(name) || name.split('/').some((part) => /^\.+$/.test(part)))
    throw new Error(`Invalid stored file name: ${name}`);
  return `${area}/${name}`;
}

/**
 * Reads a stream to the end.
 * @param body - the stream
 */
export async function readAll(body: Readable): Promise<Buffer> {
  const chunks: Buffer[] = [];
  for await (const chunk of body) chunks.push(typeof chunk === 'string' ? Buffer.from(chunk) : (chunk as Buffer));
  return Buffer.concat(chunks);
}
