/**
 * The cache of catalogue and shop answers: an answer carries a strong ETag and If-None-Match with it gets 304 and no
 * body (RFC 9110 §13.1.2, "If-None-Match", IETF, 2022); the gzip copy inflates (node:zlib) to the same JSON; and a
 * publish, a retire, new shop settings or a change written by another process (seen through the stamp) all show on
 * the next read.
 */
import { once } from 'node:events';
import { get, type IncomingHttpHeaders } from 'node:http';
import type { AddressInfo } from 'node:net';
import { gunzipSync } from 'node:zlib';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import type { ShopProductList } from '../shared/schemas/shop';
import { families } from '../server/db/schema';
import { STAMP_CHECK_MS } from '../server/services/catalogueCache';
import { familyInState } from './familiesFixtures';
import { makeTestApp, type TestApp } from './setup/testApp';

let t: TestApp;
beforeAll(async () => {
  t = await makeTestApp();
});
afterAll(async () => {
  await t.close();
});

/** GETs a path from the app on a real port and keeps the raw bytes (supertest would inflate them). */
async function rawGet(
  path: string,
  headers: Record<string, string>,
): Promise<{ headers: IncomingHttpHeaders; body: Buffer }> {
  const server = t.app.listen(0);
  await once(server, 'listening');
  try {
    const { port } = server.address() as AddressInfo;
    return await new Promise((resolve, reject) => {
      get({ host: '127.0.0.1', port, path, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () => resolve({ headers: res.headers, body: Buffer.concat(chunks) }));
      }).on('error', reject);
    });
  } finally {
    server.close();
  }
}

describe('ETag and 304', () => {
  it('answers 304 with no body to If-None-Match holding the current ETag, for the catalogue and the shop', async () => {
    const sales = await t.agent('sales');
    for (const [agent, path, scope] of [
      [sales, '/api/catalogue', 'private'],
      [sales, '/api/catalogue?colour=moss-green', 'private'],
      [await t.agent(null), '/api/shop/products', 'public'],
    ] as const) {
      const first = await agent.get(path);
      expect(first.status).toBe(200);
      const etag = first.headers.etag as string;
      // A strong validator is a quoted string without the W/ prefix (RFC 9110 §8.8.3).
      expect(etag).toMatch(/^"[^"]+"$/);
      expect(first.headers['cache-control']).toBe(`${scope}, no-cache`);
      const again = await agent.get(path).set('If-None-Match', etag);
      expect(again.status).toBe(304);
      expect(again.text ?? '').toBe('');
      const other = await agent.get(path).set('If-None-Match', '"something-else"');
      expect(other.status).toBe(200);
      expect(other.body).toEqual(first.body);
    }
  });

  it('gives different ETags to different queries', async () => {
    const sales = await t.agent('sales');
    const all = await sales.get('/api/catalogue');
    const moss = await sales.get('/api/catalogue?colour=moss-green');
    expect(all.headers.etag).not.toBe(moss.headers.etag);
    expect((moss.body.variants as CatalogueVariant[]).length).toBeLessThan((all.body.variants as unknown[]).length);
  });
});

describe('compression', () => {
  it('sends gzip to a client that accepts it, which inflates to the same JSON as the plain answer', async () => {
    const slug = ((await (await t.agent(null)).get('/api/shop/products')).body as ShopProductList).products[0].slug;
    const path = `/api/shop/products/${slug}`;
    const plain = await rawGet(path, { 'accept-encoding': 'identity' });
    expect(plain.headers['content-encoding']).toBeUndefined();
    const zipped = await rawGet(path, { 'accept-encoding': 'gzip' });
    expect(zipped.headers['content-encoding']).toBe('gzip');
    expect(zipped.headers.vary).toContain('Accept-Encoding');
    expect(zipped.headers.etag).toBe(plain.headers.etag);
    const inflated = gunzipSync(zipped.body);
    expect(zipped.body.length).toBeLessThan(inflated.length);
    expect(inflated.equals(plain.body)).toBe(true);
    expect(JSON.parse(inflated.toString('utf8')).slug).toBe(slug);
  });
});

describe('invalidation', () => {
  it('shows a publish and a retire on the next read, with a new ETag', async () => {
    const sales = await t.agent('sales');
    const shopper = await t.agent(null);
    const before = await sales.get('/api/catalogue');
    const shopBefore = await shopper.get('/api/shop/products');
    const count = (before.body.variants as CatalogueVariant[]).length;

    const family = await familyInState(t, 'published');
    const after = await sales.get('/api/catalogue').set('If-None-Match', before.headers.etag as string);
    expect(after.status).toBe(200);
    expect(after.headers.etag).not.toBe(before.headers.etag);
    const added = (after.body.variants as CatalogueVariant[]).filter((v) => v.family.id === family.id);
    expect(added.length).toBeGreaterThan(0);
    expect((after.body.variants as unknown[]).length).toBe(count + added.length);
    const shopAfter = await shopper.get('/api/shop/products').set('If-None-Match', shopBefore.headers.etag as string);
    expect(shopAfter.status).toBe(200);
    expect((shopAfter.body as ShopProductList).products.length).toBe(
      (shopBefore.body as ShopProductList).products.length + 1,
    );

    const manager = await t.agent('catalogue_manager');
    expect((await manager.post(`/api/families/${family.id}/retire`).send({})).status).toBe(200);
    const retired = await sales.get('/api/catalogue');
    expect((retired.body.variants as CatalogueVariant[]).some((v) => v.family.id === family.id)).toBe(false);
    expect(retired.headers.etag).toBe(before.headers.etag);
  });

  it('shows new shop settings (VAT rate) in the next product list', async () => {
    const shopper = await t.agent(null);
    const before = (await shopper.get('/api/shop/products')).body as ShopProductList;
    const admin = await t.agent('admin');
    const settings = (await admin.get('/api/settings/sales')).body.settings;
    const vatRatePct = settings.shop.vatRatePct === 25 ? 10 : 25;
    const saved = await admin.put('/api/settings/sales').send({ ...settings, shop: { ...settings.shop, vatRatePct } });
    expect(saved.status).toBe(200);
    const after = (await shopper.get('/api/shop/products')).body as ShopProductList;
    expect(after.prices.vatRatePct).toBe(vatRatePct);
    expect(after.products[0].fromPriceMinor).not.toBe(before.products[0].fromPriceMinor);
  });

  it('sees a change written past the services (another process) once the stamp is checked again', async () => {
    const sales = await t.agent('sales');
    const before = (await sales.get('/api/catalogue')).body.variants as CatalogueVariant[];
    const familyId = before[0].family.id;
    await t.ctx.db
      .update(families)
      .set({ publishedRevision: null, updatedAt: new Date() })
      .where(eq(families.id, familyId));
    await new Promise((resolve) => setTimeout(resolve, STAMP_CHECK_MS + 100));
    const after = (await sales.get('/api/catalogue')).body.variants as CatalogueVariant[];
    expect(after.some((v) => v.family.id === familyId)).toBe(false);
  });
});
