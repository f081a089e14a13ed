/**
 * The file store: the same behaviour on a local folder and on S3-compatible storage (the @aws-sdk/client-s3 client
 * against s3rver, an outside S3 implementation started by this test): bytes round-trip, missing keys read as null,
 * keys cannot leave their area; photos uploaded through the API land in the bucket and stream back unchanged.
 * Image checks decode the served bytes with sharp (outside decoder); object listing is read from s3rver's folder.
 */
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { fileKey, readAll, type FileStore } from '../server/storage/FileStore';
import { LocalFileStore } from '../server/storage/LocalFileStore';
import { openFileStore } from '../server/storage/openFileStore';
import { PHOTO_NORMAL_PX } from '../shared/schemas/photo';
import { startFakeS3, type FakeS3 } from './setup/fakeS3';
import { makeTestApp, type TestApp } from './setup/testApp';

let s3: FakeS3;
let dir: string;
beforeAll(async () => {
  s3 = await startFakeS3();
  dir = await mkdtemp(join(tmpdir(), 'nestwright-files-'));
});
afterAll(async () => {
  await s3.close();
  await rm(dir, { recursive: true, force: true });
});

const stores: Array<[string, () => FileStore]> = [
  ['a local folder', () => new LocalFileStore(dir)],
  ['S3-compatible storage', () => openFileStore({ DATA_DIR: dir, ...s3.env })],
];

describe.each(stores)('file store on %s', (_name, make) => {
  it('stores, streams, reads and removes files', async () => {
    const store = make();
    const bytes = randomBytes(300_000);
    const key = fileKey('print-files', `${randomBytes(8).toString('hex')}.3mf`);
    await store.put(key, bytes, 'model/3mf');
    const opened = await store.open(key);
    expect(opened?.sizeBytes).toBe(bytes.length);
    expect(opened?.contentType).toBe('model/3mf');
    expect((await readAll(opened!.body)).equals(bytes)).toBe(true);
    expect((await store.read(key))?.equals(bytes)).toBe(true);
    await store.put(key, Buffer.from('replaced'), 'model/3mf');
    expect((await store.read(key))?.toString()).toBe('replaced');
    await store.remove(key);
    expect(await store.open(key)).toBeNull();
    expect(await store.read(key)).toBeNull();
    await store.remove(key);
  });
});

describe('file keys', () => {
  it('refuse names that could leave their area', () => {
    expect(fileKey('photos', 'ab12.webp')).toBe('photos/ab12.webp');
    for (const bad of ['../x', 'a/../../x', '/etc/passwd', 'a\\b', '', 'a//b', '..'])
      expect(() => fileKey('photos', bad)).toThrow(/Invalid stored file name/);
  });
  it('cannot escape a local folder even when built by hand', async () => {
    await expect(new LocalFileStore(dir).put('../escape.txt', Buffer.from('x'), 'text/plain')).rejects.toThrow(
      /outside the store/,
    );
  });
  it('S3 settings must be complete', () => {
    expect(() => openFileStore({ DATA_DIR: dir, S3_ENDPOINT: s3.env.S3_ENDPOINT, S3_REGION: 'us-east-1' })).toThrow(
      /S3_BUCKET/,
    );
  });
});

describe('photos through the API on S3-compatible storage', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp({ DATA_DIR: dir, ...s3.env });
  });
  afterAll(async () => {
    await t.close();
  });

  it('keeps the normalised copy and the thumbnail in the bucket and streams them back', async () => {
    expect(t.ctx.files.kind).toBe('s3');
    const families = (await (await t.agent('designer')).get('/api/families')).body.families as Array<{
      id: string;
      code: string;
    }>;
    const path = `/api/families/${families.find((f) => f.code === 'MGB')!.id}/photos`;
    const big = await sharp({
      create: { width: 2000, height: 1500, channels: 3, background: { r: 90, g: 140, b: 80 } },
    })
      .jpeg()
      .toBuffer();
    const res = await (await t.agent('designer')).post(path).field('caption', 'On S3').attach('photo', big, 'a.jpg');
    expect(res.status).toBe(201);
    const served = await (
      await t.agent('sales')
    )
      .get(res.body.photo.url)
      .buffer(true)
      .parse((response, done) => {
        const chunks: Buffer[] = [];
        response.on('data', (chunk: Buffer) => chunks.push(chunk));
        response.on('end', () => done(null, Buffer.concat(chunks)));
      });
    expect(served.status).toBe(200);
    expect(served.headers['content-type']).toBe('image/webp');
    const meta = await sharp(served.body as Buffer).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['webp', PHOTO_NORMAL_PX, 1200]);
    // Nothing was written to the local folder: the objects are in s3rver's bucket folder.
    const local = await readdir(join(dir, 'uploads', 'photos')).catch(() => []);
    expect(local).toHaveLength(0);
    const bucket = await readdir(join(s3.directory, 'nestwright-test', 'photos'));
    expect(bucket.filter((name) => name.endsWith('.webp._S3rver_object')).length).toBeGreaterThanOrEqual(2);
    const wrong = await (await t.agent('sales')).get(res.body.photo.url.replace(/[0-9a-f]{4}$/, '0000'));
    expect([404, 400]).toContain(wrong.status);
  });
});
