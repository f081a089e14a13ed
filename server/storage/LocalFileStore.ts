/** {@link FileStore} on a local folder (DATA_DIR/uploads by default): one file per key, written atomically. */
import { createReadStream } from 'node:fs';
import { mkdir, rename, rm, stat, writeFile } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { dirname, extname, join, resolve, sep } from 'node:path';
import { readAll, type FileStore, type StoredFile } from './FileStore';

const TYPES_BY_EXTENSION: Record<string, string> = {
  '.webp': 'image/webp',
  '.png': 'image/png',
  '.jpg': 'image/jpeg',
  '.pdf': 'application/pdf',
  '.stl': 'model/stl',
  '.3mf': 'model/3mf',
  '.csv': 'text/csv',
  '.zip': 'application/zip',
};

/** Files in a folder; see the file comment. */
export class LocalFileStore implements FileStore {
  readonly kind = 'local' as const;
  private readonly root: string;

  /** @param root - the folder (created on first write) */
  constructor(root: string) {
    this.root = resolve(root);
  }

  async put(key: string, bytes: Uint8Array, _contentType: string): Promise<void> {
    const path = this.pathOf(key);
    await mkdir(dirname(path), { recursive: true });
    // Write beside and rename, so a reader never sees half a file and a crash leaves no torn one.
    const temporary = `${path}.${randomBytes(6).toString('hex')}.part`;
    await writeFile(temporary, bytes);
    await rename(temporary, path);
  }

  async open(key: string): Promise<StoredFile | null> {
    const path = this.pathOf(key);
    const info = await stat(path).catch(() => null);
    if (!info?.isFile()) return null;
    return {
      body: createReadStream(path),
      sizeBytes: info.size,
      contentType: TYPES_BY_EXTENSION[extname(path).toLowerCase()] ?? 'application/octet-stream',
    };
  }

  async read(key: string): Promise<Buffer | null> {
    const file = await this.open(key);
    return file ? readAll(file.body) : null;
  }

  async remove(key: string): Promise<void> {
    await rm(this.pathOf(key), { force: true });
  }

  private pathOf(key: string): string {
    const path = resolve(join(this.root, key));
    if (!path.startsWith(this.root + sep)) throw new Error(`Stored file key outside the store: ${key}`);
    return path;
  }
}
