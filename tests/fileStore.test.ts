/**
 * The file store: the same behaviour on a local folder and on S3-compatible storage (the @aws-sdk/client-s3 client
 * against s3rver, an outside S3 implementation started by this test): bytes round-trip, missing keys read as null,
 * keys cannot leave their area; photos uploaded through the API land in the bucket and stream back unchanged; spec
 * sheets are stored as documents in the bucket and served from there (staff and shop alike); print files are stored
 * there once and what the farm receives is the stored file.
 * Image checks decode the served bytes with sharp (outside decoder); PDFs are read with Debian's pdftotext
 * (poppler); STL files with Debian's admesh; object listing is read from s3rver's folder.
 */
import { execFileSync } from 'node:child_process';
import { mkdtemp, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { randomBytes } from 'node:crypto';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { FarmClient } from '../server/farm/FarmClient';
import { ensurePrintFile, printFileKey } from '../server/farm/printFiles';
import { listCatalogueVariants } from '../server/services/catalogue';
import { fileKey, readAll, type FileStore } from '../server/storage/FileStore';
import { LocalFileStore } from '../server/storage/LocalFileStore';
import { openFileStore } from '../server/storage/openFileStore';
import { PHOTO_NORMAL_PX } from '../shared/schemas/photo';
import { startFakeS3, type FakeS3 } from './setup/fakeS3';
import { binaryBody } from './setup/salesTestApp';
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

describe('generated documents and print files on S3-compatible storage', () => {
  let t: TestApp;
  let local: string;
  beforeAll(async () => {
    local = await mkdtemp(join(tmpdir(), 'nestwright-files-docs-'));
    t = await makeTestApp({ DATA_DIR: local, ...s3.env });
  });
  afterAll(async () => {
    await t.close();
    await rm(local, { recursive: true, force: true });
  });

  /** Object names s3rver keeps under a folder of the bucket. */
  const objectsIn = async (folder: string) =>
    (await readdir(join(s3.directory, 'nestwright-test', folder)).catch(() => [] as string[])).filter((name) =>
      name.endsWith('._S3rver_object'),
    );

  /** pdftotext's reading of a PDF, line breaks folded. */
  async function pdfText(bytes: Buffer): Promise<string> {
    const file = join(local, `sheet-${randomBytes(4).toString('hex')}.pdf`);
    await writeFile(file, bytes);
    return execFileSync('pdftotext', [file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
  }

  it('stores a spec sheet once in the bucket and streams it to staff and the shop from there', async () => {
    const [variant] = await listCatalogueVariants(t.ctx, {});
    const sales = await t.agent('sales');
    const first = await sales.get(`/api/variants/${variant.sku}/spec-sheet.pdf`).buffer(true).parse(binaryBody);
    expect(first.status).toBe(200);
    expect(first.headers['content-type']).toBe('application/pdf');
    expect(first.headers['content-disposition']).toBe(`attachment; filename="spec-sheet-${variant.sku}.pdf"`);
    const bytes = first.body as Buffer;
    // A PDF file begins with its header "%PDF-" (ISO 32000-1:2008, 7.5.2, ISO, 2008); pdftotext reads the SKU.
    expect(bytes.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    expect(await pdfText(bytes)).toContain(variant.sku);
    const stored = await objectsIn('documents/spec-sheets');
    expect(stored).toHaveLength(1);

    // Again, and from the shop: the same stored document, byte for byte, and no second object.
    const again = await sales.get(`/api/variants/${variant.sku}/spec-sheet.pdf`).buffer(true).parse(binaryBody);
    expect(Number(again.headers['content-length'])).toBe(bytes.length);
    expect((again.body as Buffer).equals(bytes)).toBe(true);
    const shop = await (
      await t.agent(null)
    )
      .get(`/api/shop/variants/${variant.sku}/spec-sheet.pdf`)
      .buffer(true)
      .parse(binaryBody);
    expect(shop.status).toBe(200);
    expect((shop.body as Buffer).equals(bytes)).toBe(true);
    expect(await objectsIn('documents/spec-sheets')).toEqual(stored);
    // Nothing was written to the local folder.
    expect(await readdir(join(local, 'uploads')).catch(() => [])).toHaveLength(0);
  });

  it('stores a print file in the bucket, streams it, and sends the farm the stored file', async () => {
    const [variant] = await listCatalogueVariants(t.ctx, {});
    const hash = variant.sha256!;
    const operations = await t.agent('operations');
    const res = await operations.get(`/api/farm/print-files/${hash}.stl`).buffer(true).parse(binaryBody);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('model/stl');
    const stl = res.body as Buffer;
    // Binary STL: an 80-byte header, a 32-bit facet count, then 50 bytes per facet (StereoLithography Interface
    // Specification, 3D Systems, 1989); admesh reads the same count.
    const facets = stl.readUInt32LE(80);
    expect(stl.length).toBe(84 + 50 * facets);
    const file = join(local, 'print.stl');
    await writeFile(file, stl);
    const admesh = execFileSync('admesh', [file], { encoding: 'utf8' });
    expect(Number(/Number of facets\s*:\s*(\d+)/.exec(admesh)?.[1])).toBe(facets);
    expect(await objectsIn('print-files')).toEqual([`${hash}.stl._S3rver_object`]);
    expect((await t.ctx.files.read(printFileKey(hash)))?.equals(stl)).toBe(true);

    // The farm lacks it: what it receives is the stored file, not a new build.
    const sent: Uint8Array[] = [];
    const farm = {
      hasPrintFile: async () => false,
      putPrintFile: async (_hash: string, body: Uint8Array) => {
        sent.push(body);
        return {};
      },
    } as unknown as FarmClient;
    const marker = Buffer.concat([Buffer.from('stored copy'), stl.subarray(11)]);
    await t.ctx.files.put(printFileKey(hash), marker, 'model/stl');
    await ensurePrintFile(t.ctx.db, t.ctx.files, farm, hash, variant.sku);
    expect(sent).toHaveLength(1);
    expect(Buffer.from(sent[0]).equals(marker)).toBe(true);

    const badHash = await operations.get(`/api/farm/print-files/${'0'.repeat(64)}.stl`);
    expect(badHash.status).toBe(409);
    expect(badHash.body.error.message).toMatch(/^No print file: no variant has the mesh/);
    expect((await operations.get('/api/farm/print-files/not-a-hash.stl')).status).toBe(400);
  });
});
