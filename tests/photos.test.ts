/**
 * Sample photos: accepted by content (JPEG, PNG, WebP magic bytes), refused when a ".png" name holds text or the
 * file is too large, thumbnailed and normalised with sharp, stored under DATA_DIR/uploads with random names, and
 * served only to signed-in people. Image sizes are measured by sharp on the served bytes (outside decoder).
 * File signatures: source: PNG spec (ISO/IEC 15948) 8-byte signature; JPEG SOI FF D8 FF; WebP RIFF....WEBP (RFC 9649).
 */
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp, { type Metadata } from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PHOTO_MAX_BYTES, PHOTO_NORMAL_PX, PHOTO_THUMB_PX } from '../shared/schemas/photo';
import { detectPhotoType } from '../server/services/photoService';
import { pngBytes } from './familiesFixtures';
import { makeTestApp, type TestApp } from './setup/testApp';

let t: TestApp;
let dataDir: string;
let familyPath: string;

beforeAll(async () => {
  dataDir = await mkdtemp(join(tmpdir(), 'nestwright-photos-'));
  t = await makeTestApp({ DATA_DIR: dataDir });
  const families = (await (await t.agent('designer')).get('/api/families')).body.families as Array<{
    id: string;
    code: string;
  }>;
  familyPath = `/api/families/${families.find((f) => f.code === 'MGB')!.id}/photos`;
});
afterAll(async () => {
  await t.close();
  await rm(dataDir, { recursive: true, force: true });
});

async function fetchImage(
  agentRole: 'sales' | 'designer',
  url: string,
): Promise<Metadata & { status: number; type: string }> {
  const res = await (
    await t.agent(agentRole)
  )
    .get(url)
    .buffer(true)
    .parse((response, done) => {
      const chunks: Buffer[] = [];
      response.on('data', (chunk: Buffer) => chunks.push(chunk));
      response.on('end', () => done(null, Buffer.concat(chunks)));
    });
  const meta = await sharp(res.body as Buffer).metadata();
  return { ...meta, status: res.status, type: String(res.headers['content-type']) };
}

describe('detecting the image type by content', () => {
  it('knows the three signatures and nothing else', async () => {
    expect(detectPhotoType(await pngBytes())).toBe('image/png');
    expect(
      detectPhotoType(
        await sharp(await pngBytes())
          .jpeg()
          .toBuffer(),
      ),
    ).toBe('image/jpeg');
    expect(
      detectPhotoType(
        await sharp(await pngBytes())
          .webp()
          .toBuffer(),
      ),
    ).toBe('image/webp');
    expect(detectPhotoType(Buffer.from('GIF89a...'))).toBeNull();
    expect(detectPhotoType(Buffer.from('not an image at all'))).toBeNull();
  });
});

describe('uploading photos', () => {
  it('accepts a large JPEG, keeps a 1600 px copy and a 320 px thumbnail outside the web root', async () => {
    // a 2400 × 1800 photo-like JPEG
    const big = await sharp(await pngBytes(240, 180))
      .resize(2400, 1800)
      .jpeg({ quality: 80 })
      .toBuffer();
    const res = await (
      await t.agent('designer')
    )
      .post(familyPath)
      .field('caption', 'First sample, sand PLA')
      .attach('photo', big, 'sample.jpg');
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const photo = res.body.photo;
    expect(photo.originalType).toBe('image/jpeg');
    expect(photo.caption).toBe('First sample, sand PLA');
    expect(photo.uploadedBy.name).toBe('Maren Hale');
    // 2400 × 1800 scaled to fit 1600: 1600 × 1200 (arithmetic)
    expect([photo.widthPx, photo.heightPx]).toEqual([PHOTO_NORMAL_PX, 1200]);

    const normal = await fetchImage('sales', photo.url);
    expect(normal.status).toBe(200);
    expect(normal.type).toBe('image/webp');
    expect([normal.width, normal.height]).toEqual([1600, 1200]);
    const thumb = await fetchImage('sales', photo.thumbUrl);
    expect(Math.max(thumb.width ?? 0, thumb.height ?? 0)).toBe(PHOTO_THUMB_PX);

    const files = await readdir(join(dataDir, 'uploads', 'photos'));
    expect(files).toHaveLength(2);
    for (const file of files) {
      expect(file).toMatch(/^[0-9a-f]{32}\.webp$/);
      expect(file).not.toContain('sample');
    }
    const family = (await (await t.agent('catalogue_manager')).get(familyPath.replace('/photos', ''))).body.family;
    expect(family.photos.map((p: { id: string }) => p.id)).toContain(photo.id);
  });

  it('accepts a PNG named .jpg and a WebP (the content decides), and keeps small images at their size', async () => {
    const designer = await t.agent('designer');
    const png = await designer.post(familyPath).attach('photo', await pngBytes(64, 48), 'actually-a-png.jpg');
    expect(png.status).toBe(201);
    expect(png.body.photo.originalType).toBe('image/png');
    expect([png.body.photo.widthPx, png.body.photo.heightPx]).toEqual([64, 48]);
    const webp = await designer.post(familyPath).attach(
      'photo',
      await sharp(await pngBytes())
        .webp()
        .toBuffer(),
      'x.webp',
    );
    expect(webp.status).toBe(201);
    expect(webp.body.photo.originalType).toBe('image/webp');
  });

  it('refuses text in a file named .png', async () => {
    const res = await (
      await t.agent('designer')
    )
      .post(familyPath)
      .attach('photo', Buffer.from('<?php echo "hello"; ?>\n'), { filename: 'innocent.png', contentType: 'image/png' });
    expect(res.status).toBe(400);
    // A sentence for people, pointed at the photo field (no field key in the text).
    expect(res.body.error.message).toMatch(/^This file is not a JPEG, PNG or WebP image/);
    expect(res.body.error.details[0].path).toBe('photo');
  });

  it('refuses a file over the size limit with 413', async () => {
    const tooBig = Buffer.alloc(PHOTO_MAX_BYTES + 1024);
    (await pngBytes()).copy(tooBig);
    const res = await (await t.agent('designer')).post(familyPath).attach('photo', tooBig, 'huge.png');
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('payload_too_large');
  });

  it('asks for a file when none is attached', async () => {
    const res = await (await t.agent('designer')).post(familyPath).field('caption', 'no file');
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('Attach one photo (JPEG, PNG or WebP).');
    expect(res.body.error.details[0].path).toBe('photo');
  });

  it('serves photos only to signed-in people and refuses uploads from other roles', async () => {
    const uploaded = await (await t.agent('designer')).post(familyPath).attach('photo', await pngBytes(), 'a.png');
    expect((await (await t.agent(null)).get(uploaded.body.photo.url)).status).toBe(401);
    expect((await (await t.agent(null)).get(uploaded.body.photo.thumbUrl)).status).toBe(401);
    expect((await (await t.agent('sales')).post(familyPath).attach('photo', await pngBytes(), 'a.png')).status).toBe(
      403,
    );
    expect((await (await t.agent('sales')).get('/api/photos/not-a-uuid')).status).toBe(400);
    expect((await (await t.agent('sales')).get(`/api/photos/${crypto.randomUUID()}`)).status).toBe(404);
  });
});
