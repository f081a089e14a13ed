/**
 * The cache of catalogue and shop answers: an answer carries a strong ETag and If-None-Match with it gets 304 and no
 * body (RFC 9110 §13.1.2, "If-None-Match", IETF, 2022); the gzip copy inflates (node:zlib) to the same JSON; an answer
 * sent again before the middleware chain has the same headers and bytes as the first and lets in the same people; and
 * a publish, a retire, new shop settings or a change written by another process (seen through the stamp) all show on
 * the next read.
 */
import { once } from 'node:events';
import { get, type IncomingHttpHeaders } from 'node:http';
import type { AddressInfo } from 'node:net';
import { gunzipSync } from 'node:zlib';
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import type { ShopProductList } from '../shared/schemas/shop';
import { SESSION_COOKIE_NAME } from '../server/auth/lucia';
import { families } from '../server/db/schema';
import { STAMP_CHECK_MS } from '../server/services/catalogueCache';
import { familyInState } from './familiesFixtures';
import { useTestApp, TEST_ORIGIN } from './setup/testApp';

const t = useTestApp();

/** GETs a path from the app on a real port and keeps the raw bytes (supertest would inflate them). */
async function rawGet(
  path: string,
  headers: Record<string, string>,
): Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }> {
  const server = t.app.listen(0);
  await once(server, 'listening');
  try {
    const { port } = server.address() as AddressInfo;
    return await new Promise((resolve, reject) => {
      get({ host: '127.0.0.1', port, path, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (chunk: Buffer) => chunks.push(chunk));
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, headers: res.headers, body: Buffer.concat(chunks) }),
        );
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

/** Signs in with supertest and returns the session cookie (name=value) for raw requests. */
async function sessionCookie(email: string): Promise<string> {
  const res = await supertest(t.app)
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email, password: 'fernhollow-demo' });
  expect(res.status).toBe(200);
  const cookie = (res.headers['set-cookie'] as unknown as string[] | undefined)?.[0]?.split(';')[0];
  if (!cookie) throw new Error('no session cookie');
  return cookie;
}

/** Headers of an answer without the ones set per connection and per request. */
function lasting(headers: IncomingHttpHeaders): IncomingHttpHeaders {
  const { date: _date, connection: _connection, 'keep-alive': _keepAlive, ...rest } = headers;
  return rest;
}

describe('answers sent again before the middleware chain', () => {
  it('repeats the first answer byte for byte with the same headers, and its 304, for the catalogue and the shop', async () => {
    const cookie = await sessionCookie('ada@fernhollow.test');
    for (const [path, headers] of [
      ['/api/catalogue', { cookie, 'accept-encoding': 'gzip, deflate, br' }],
      ['/api/catalogue?colour=moss-green', { cookie, 'accept-encoding': 'gzip' }],
      ['/api/shop/products', { 'accept-encoding': 'gzip, deflate, br' }],
    ] as const) {
      const first = await rawGet(path, headers);
      const again = await rawGet(path, headers);
      const third = await rawGet(path, headers);
      expect(first.headers['content-encoding']).toBe('gzip');
      // Security headers of the chain are part of what is repeated (helmet sets them on every answer).
      expect(again.headers['content-security-policy']).toBeDefined();
      expect(again.headers['x-content-type-options']).toBe('nosniff');
      for (const later of [again, third]) {
        expect(lasting(later.headers)).toEqual(lasting(first.headers));
        expect(later.body.equals(first.body)).toBe(true);
      }
      expect(again.headers['set-cookie']).toBeUndefined();
      const etag = first.headers.etag as string;
      const notModified = await rawGet(path, { ...headers, 'if-none-match': `"other", ${etag}` });
      expect(notModified.status).toBe(304);
      expect(notModified.body.length).toBe(0);
      expect(notModified.headers.etag).toBe(etag);
      // A request that asks for no cached copy (Cache-Control: no-cache) gets the full answer (RFC 9111 §5.2.1.4).
      const forced = await rawGet(path, { ...headers, 'if-none-match': etag, 'cache-control': 'no-cache' });
      expect(forced.status).toBe(200);
      expect(forced.body.equals(first.body)).toBe(true);
    }
  });

  it('lets in only the people the route lets in: signed out gets 401 and a role without the catalogue gets 403', async () => {
    const headers = { 'accept-encoding': 'gzip, deflate, br' };
    const sales = await sessionCookie('ada@fernhollow.test');
    expect((await rawGet('/api/catalogue', { ...headers, cookie: sales })).status).toBe(200);
    expect((await rawGet('/api/catalogue', { ...headers, cookie: sales })).status).toBe(200);
    expect((await rawGet('/api/catalogue', headers)).status).toBe(401);
    const operations = await sessionCookie('ines@fernhollow.test');
    // Twice: the second time the session is remembered, so the check is the repeat's own.
    expect((await rawGet('/api/catalogue', { ...headers, cookie: operations })).status).toBe(403);
    expect((await rawGet('/api/catalogue', { ...headers, cookie: operations })).status).toBe(403);
    expect((await rawGet('/api/catalogue', { ...headers, cookie: `${SESSION_COOKIE_NAME}=unknown` })).status).toBe(401);
  });

  it('stops repeating a signed-out session at once', async () => {
    const headers = { 'accept-encoding': 'gzip' };
    const cookie = await sessionCookie('ada@fernhollow.test');
    expect((await rawGet('/api/catalogue', { ...headers, cookie })).status).toBe(200);
    expect((await rawGet('/api/catalogue', { ...headers, cookie })).status).toBe(200);
    const out = await supertest(t.app).post('/api/auth/sign-out').set('Origin', TEST_ORIGIN).set('Cookie', cookie);
    expect(out.status).toBeLessThan(300);
    expect((await rawGet('/api/catalogue', { ...headers, cookie })).status).toBe(401);
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
