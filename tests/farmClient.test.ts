import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { FakeFarm } from '../server/farm/FakeFarm';
import { FarmClient, FarmError, parseRetryAfter } from '../server/farm/FarmClient';
import {
  NOTICE_SIGNATURE_HEADER,
  NOTICE_TIMESTAMP_HEADER,
  signNotice,
  verifyNotice,
} from '../server/farm/farmSignature';
import { FarmNoticeSchema, type FarmNotice, type WorkOrderInput } from '../shared/schemas/farm';
import { writeStl } from '../shared/mesh/writeStl';

const SECRET = 'test-notice-secret-0123456789';
const HASH_A = 'a'.repeat(64);
const HASH_B = 'b'.repeat(64);

/** A tetrahedron as binary STL: a valid print file. */
const STL = writeStl({
  positions: new Float32Array([0, 0, 0, 10, 0, 0, 0, 10, 0, 0, 0, 10]),
  indices: new Uint32Array([0, 2, 1, 0, 1, 3, 1, 2, 3, 0, 3, 2]),
});

function order(reference: string, extra: Partial<WorkOrderInput> = {}): WorkOrderInput {
  return {
    reference,
    kind: 'single',
    lines: [{ lineRef: 'FH-TEST-1', meshSha256: HASH_A, material: 'pla', colour: 'sand', quantity: 1 }],
    shipTo: {
      name: 'Ada Wren',
      line1: '4 Orchard Lane',
      line2: '',
      city: 'Lowmoor',
      region: '',
      postalCode: 'LM1 2AB',
      country: 'GB',
    },
    ...extra,
  };
}

async function until<T>(
  read: () => T | undefined | Promise<T | undefined>,
  what: string,
  limitMs = 20_000,
): Promise<T> {
  const stop = Date.now() + limitMs;
  for (;;) {
    const value = await read();
    if (value) return value;
    if (Date.now() > stop) throw new Error(`gave up waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
}

let farm: FakeFarm;
let client: FarmClient;
let receiver: Server;
const notices: FarmNotice[] = [];
const refused: string[] = [];

beforeAll(async () => {
  receiver = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (chunk: Buffer) => chunks.push(chunk));
    req.on('end', () => {
      const body = Buffer.concat(chunks);
      const check = verifyNotice(
        SECRET,
        {
          timestamp: req.headers[NOTICE_TIMESTAMP_HEADER] as string,
          signature: req.headers[NOTICE_SIGNATURE_HEADER] as string,
        },
        body,
      );
      if (!check.ok) refused.push(check.reason);
      else notices.push(FarmNoticeSchema.parse(JSON.parse(body.toString('utf8'))));
      res.statusCode = check.ok ? 204 : 400;
      res.end();
    });
  });
  await new Promise<void>((resolve) => receiver.listen(0, '127.0.0.1', resolve));
  farm = new FakeFarm({
    apiKey: 'k',
    noticeSecret: SECRET,
    speed: 50_000,
    noticeUrl: `http://127.0.0.1:${(receiver.address() as AddressInfo).port}/`,
  });
  await farm.listen(0);
  client = new FarmClient({ baseUrl: farm.url, apiKey: 'k', backoffBaseMs: 5, maxAttempts: 3 });
  await client.putPrintFile(HASH_A, STL, 'stl');
});

afterAll(async () => {
  await farm.close();
  await new Promise((resolve) => receiver.close(resolve));
});

describe('fake farm through our client', () => {
  it('stores a print file once per mesh hash and refuses what is not a print file', async () => {
    expect(await client.hasPrintFile(HASH_A)).toBe(true);
    expect(await client.hasPrintFile(HASH_B)).toBe(false);
    const again = await client.putPrintFile(HASH_A, STL, 'stl');
    expect(again).toMatchObject({ meshSha256: HASH_A, format: 'stl', bytes: STL.length });
    expect(farm.floor.counters.filesStored).toBe(1);
    await expect(client.putPrintFile(HASH_B, new TextEncoder().encode('hello'), 'stl')).rejects.toMatchObject({
      status: 415,
      retryable: false,
    });
  });

  it('creates a work order once per idempotency key and refuses the key for a different order', async () => {
    const first = await client.createWorkOrder(order('NW-9001'), 'dispatch-1');
    const repeat = await client.createWorkOrder(order('NW-9001'), 'dispatch-1');
    expect(repeat.id).toBe(first.id);
    await expect(client.createWorkOrder(order('NW-9002'), 'dispatch-1')).rejects.toMatchObject({
      status: 409,
      code: 'idempotency_key_reused',
    });
    const listed = await fetch(`${farm.url}/v1/work-orders?reference=NW-9001`, {
      headers: { authorization: 'Bearer k' },
    }).then((r) => r.json() as Promise<{ workOrders: unknown[] }>);
    expect(listed.workOrders).toHaveLength(1);
  });

  it('moves a work order to handed over with a parcel and sends a signed notice for every stage', async () => {
    const created = await client.createWorkOrder(order('NW-9003'), 'dispatch-3');
    const done = await until(async () => {
      const now = await client.getWorkOrder(created.id);
      return now.stage === 'handed_over' ? now : undefined;
    }, 'handed over');
    expect(done.parcel?.trackingCode).toMatch(/^[A-Z]{2}\d{12}$/);
    expect(done.parcel?.trackingUrl).toContain(done.parcel?.trackingCode);
    await until(
      () => notices.find((n) => n.workOrder.id === created.id && n.workOrder.stage === 'handed_over'),
      'notice',
    );
    const stages = notices.filter((n) => n.workOrder.id === created.id).map((n) => n.workOrder.stage);
    expect(stages).toEqual(['accepted', 'scheduled', 'printing', 'packing', 'handed_over']);
    expect(refused).toEqual([]);
  });

  it('holds an undeliverable address and an out-of-stock colour, and withdraws a held order', async () => {
    await fetch(`${farm.url}/v1/test-faults`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ rejectAddressesMatching: 'NOWHERE', outOfStock: [{ material: 'pla', colour: 'black' }] }),
    });
    const bad = await client.createWorkOrder(
      order('NW-9004', { shipTo: { ...order('x').shipTo, postalCode: 'NOWHERE 1' } }),
      'dispatch-4',
    );
    const black = await client.createWorkOrder(
      order('NW-9005', {
        lines: [{ lineRef: 'FH-TEST-B', meshSha256: HASH_A, material: 'pla', colour: 'black', quantity: 2 }],
      }),
      'dispatch-5',
    );
    const heldBad = await until(async () => {
      const now = await client.getWorkOrder(bad.id);
      return now.stage === 'on_hold' ? now : undefined;
    }, 'address hold');
    expect(heldBad.hold?.code).toBe('address_undeliverable');
    const heldBlack = await until(async () => {
      const now = await client.getWorkOrder(black.id);
      return now.stage === 'on_hold' ? now : undefined;
    }, 'colour hold');
    expect(heldBlack.hold).toMatchObject({ code: 'colour_unavailable' });
    expect((await client.withdrawWorkOrder(bad.id)).stage).toBe('withdrawn');
    await fetch(`${farm.url}/v1/test-faults`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ rejectAddressesMatching: null, outOfStock: [] }),
    });
  });

  it('reprints a failed plate and records it on the line', async () => {
    farm.floor.faults.failPrints = 1;
    const created = await client.createWorkOrder(order('NW-9006'), 'dispatch-6');
    const done = await until(async () => {
      const now = await client.getWorkOrder(created.id);
      return now.stage === 'handed_over' ? now : undefined;
    }, 'shipped after reprint');
    expect(done.lines[0].reprints).toBe(1);
    await until(() => notices.find((n) => n.workOrder.id === created.id && n.kind === 'reprint'), 'reprint notice');
  });

  it('loses notices on request while status queries still tell the truth', async () => {
    farm.floor.faults.loseNotices = 100;
    const created = await client.createWorkOrder(order('NW-9007'), 'dispatch-7');
    const done = await until(async () => {
      const now = await client.getWorkOrder(created.id);
      return now.stage === 'handed_over' ? now : undefined;
    }, 'shipped');
    expect(done.stage).toBe('handed_over');
    expect(notices.filter((n) => n.workOrder.id === created.id)).toEqual([]);
    farm.floor.faults.loseNotices = 0;
  });
});

describe('client retries', () => {
  it('retries a farm that is down with growing, jittered waits, then gives up with a retryable error', async () => {
    const waits: number[] = [];
    const slow = new FarmClient({
      baseUrl: farm.url,
      apiKey: 'k',
      maxAttempts: 4,
      backoffBaseMs: 100,
      sleep: async (ms) => void waits.push(ms),
      random: () => 0.5,
    });
    farm.floor.faults.down = true;
    const error = await slow.getWorkOrder('wo_x').catch((err: unknown) => err);
    farm.floor.faults.down = false;
    expect(error).toBeInstanceOf(FarmError);
    expect(error).toMatchObject({ status: 503, retryable: true });
    // Full jitter with random 0.5: 0.5 × 100 × 2^n for n = 1, 2, 3.
    expect(waits).toEqual([100, 200, 400]);
  });

  it('waits as long as a 429 Retry-After says and then succeeds', async () => {
    const waits: number[] = [];
    const patient = new FarmClient({ baseUrl: farm.url, apiKey: 'k', sleep: async (ms) => void waits.push(ms) });
    farm.floor.faults.throttle = 2;
    expect(await patient.hasPrintFile(HASH_A)).toBe(true);
    expect(waits).toEqual([1000, 1000]);
  });

  it('reads Retry-After as seconds or as an HTTP date', () => {
    // source: RFC 9110 "HTTP Semantics", IETF, 2022, §10.2.3 — delay-seconds or HTTP-date
    expect(parseRetryAfter('120')).toBe(120_000);
    expect(parseRetryAfter('Wed, 21 Oct 2015 07:28:00 GMT', Date.parse('2015-10-21T07:27:30Z'))).toBe(30_000);
    expect(parseRetryAfter('soon')).toBeUndefined();
  });

  it('times out a farm that never answers', async () => {
    const silent = createServer(() => undefined);
    await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
    const impatient = new FarmClient({
      baseUrl: `http://127.0.0.1:${(silent.address() as AddressInfo).port}`,
      apiKey: 'k',
      timeoutMs: 200,
      maxAttempts: 2,
      sleep: async () => undefined,
    });
    await expect(impatient.getWorkOrder('wo_x')).rejects.toMatchObject({ code: 'timeout', retryable: true });
    silent.closeAllConnections();
    await new Promise((resolve) => silent.close(resolve));
  });

  it('does not retry a refusal', async () => {
    const wrongKey = new FarmClient({ baseUrl: farm.url, apiKey: 'wrong', sleep: async () => undefined });
    await expect(wrongKey.getWorkOrder('wo_x')).rejects.toMatchObject({ status: 401, retryable: false });
  });
});

describe('notice signatures', () => {
  it('is HMAC-SHA256 over the timestamp, a newline and the body, as Web Crypto computes it', async () => {
    // source: RFC 4231 "Identifiers and Test Vectors for HMAC-SHA-224, -256, -384, and -512", IETF, 2005, test
    // case 2 — checks the Web Crypto reference before it is used to check our signature.
    const hmac = async (key: string, data: string) => {
      const k = await crypto.subtle.importKey(
        'raw',
        new TextEncoder().encode(key),
        { name: 'HMAC', hash: 'SHA-256' },
        false,
        ['sign'],
      );
      return Buffer.from(await crypto.subtle.sign('HMAC', k, new TextEncoder().encode(data))).toString('hex');
    };
    expect(await hmac('Jefe', 'what do ya want for nothing?')).toBe(
      '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843',
    );
    const body = '{"noticeId":"nt_1"}';
    expect(signNotice(SECRET, 1_760_000_000, body)).toBe(`hmac-sha256=${await hmac(SECRET, `1760000000\n${body}`)}`);
  });

  it('refuses a changed body, a wrong secret, a missing signature and a stale or future timestamp', () => {
    const body = Buffer.from('{"noticeId":"nt_1"}');
    const now = 1_760_000_000;
    const signature = signNotice(SECRET, now, body);
    expect(verifyNotice(SECRET, { timestamp: String(now), signature }, body, now)).toEqual({ ok: true });
    expect(
      verifyNotice(SECRET, { timestamp: String(now), signature }, Buffer.from('{"noticeId":"nt_2"}'), now).ok,
    ).toBe(false);
    expect(verifyNotice('another-secret-000000', { timestamp: String(now), signature }, body, now).ok).toBe(false);
    expect(verifyNotice(SECRET, { timestamp: String(now) }, body, now).ok).toBe(false);
    expect(verifyNotice(SECRET, { timestamp: String(now), signature }, body, now + 301)).toMatchObject({ ok: false });
    expect(verifyNotice(SECRET, { timestamp: String(now), signature }, body, now - 301)).toMatchObject({ ok: false });
  });
});
