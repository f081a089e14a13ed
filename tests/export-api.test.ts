/**
 * `POST /api/exports` and `GET /api/templates` through the real app: files with their hash headers, the server
 * path giving the same mesh hash as the in-process (browser) path, 400s naming the field and its range, and a
 * time-limited worker that stops a slow build while the server keeps answering.
 */
import { createHash } from 'node:crypto';
import { unzipSync, strFromU8 } from 'fflate';
import { beforeAll, describe, expect, it } from 'vitest';
import { HttpError } from '../server/http/HttpError';
import { exportDesign } from '../server/services/exportDesign';
import { ExportError, ExportWorker } from '../server/workers/ExportWorker';
import { generate } from '../templates/index';
import { useTestApp, type TestAgent } from './setup/testApp';

const t = useTestApp();
let designer: TestAgent;

beforeAll(async () => {
  designer = await t.agent('designer');
});

/** supertest buffers binary bodies only with a parser. */
function binary(res: NodeJS.ReadableStream, done: (err: Error | null, body: unknown) => void): void {
  const chunks: Buffer[] = [];
  res.on('data', (chunk: Buffer) => chunks.push(chunk));
  res.on('end', () => done(null, Buffer.concat(chunks)));
}

describe('POST /api/exports', () => {
  it('returns a binary STL whose hash equals the in-process (browser) generation of the same parameters', async () => {
    const params = { entryHoleDiameterMm: 28, trimStyle: 'boards' };
    const res = await designer
      .post('/api/exports')
      .send({ templateId: 'gable-box', params, format: 'stl' })
      .buffer(true)
      .parse(binary as never);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('model/stl');
    const version = (await generate('gable-box', {})).template.version;
    expect(res.headers['content-disposition']).toMatch(
      new RegExp(`^attachment; filename="gable-box-v${version}-[0-9a-f]{8}\\.stl"$`),
    );
    const local = await generate('gable-box', params);
    expect(res.headers['x-mesh-sha256']).toBe(local.sha256);
    expect(Number(res.headers['x-mesh-triangles'])).toBe(local.triangles);
    // source: Bourke — 84 + 50·N bytes
    expect((res.body as Buffer).byteLength).toBe(84 + 50 * local.triangles);
  }, 60_000);

  it('returns a 3MF package in millimetres', async () => {
    const res = await designer
      .post('/api/exports')
      .send({ templateId: 'round-pod', params: {}, format: '3mf' })
      .buffer(true)
      .parse(binary as never);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('model/3mf');
    const model = strFromU8(unzipSync(new Uint8Array(res.body as Buffer))['3D/3dmodel.model']);
    expect(model).toMatch(/<model unit="millimeter"/);
    expect([...model.matchAll(/<triangle /g)].length).toBe(Number(res.headers['x-mesh-triangles']));
  }, 60_000);

  it('lays a 3MF on the named printer in the named material and colour, and names both hashes', async () => {
    const res = await designer
      .post('/api/exports')
      .send({
        templateId: 'gable-box',
        params: {},
        format: '3mf',
        printerId: 'rowan-farm-06',
        materialId: 'pla',
        colourId: 'moss-green',
      })
      .buffer(true)
      .parse(binary as never);
    expect(res.status).toBe(200);
    const bytes = new Uint8Array(res.body as Buffer);
    // source: node:crypto, an independent sha256 of the bytes received
    expect(res.headers['x-file-sha256']).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(res.headers['x-mesh-sha256']).toMatch(/^[0-9a-f]{64}$/);
    const model = strFromU8(unzipSync(bytes)['3D/3dmodel.model']);
    // source: 3MF Core Specification v1.3, 3MF Consortium, 2022 (§4.1 base materials, displaycolor #RRGGBBAA)
    expect(model).toMatch(/<basematerials id="1"><base name="PLA, Moss green" displaycolor="#[0-9A-F]{8}"\/>/);
    expect(model).toContain('name="body" type="model" pid="1" pindex="0"');
    expect(model).toContain('name="floor plug" type="model" pid="1" pindex="0"');
    const bad = await designer
      .post('/api/exports')
      .send({ templateId: 'gable-box', params: {}, format: '3mf', materialId: 'pla', colourId: 'plaid' });
    expect(bad.status).toBe(400);
  }, 60_000);

  it.each([
    [{ templateId: 'dovecote', params: {}, format: 'stl' }, 'templateId', /^There is no template called "dovecote"\.$/],
    [
      { templateId: 'a-frame', params: { chimney: true }, format: 'stl' },
      'params.chimney',
      /chimney is not a parameter of a-frame/,
    ],
    [
      { templateId: 'a-frame', params: { entryHoleDiameterMm: 80 }, format: 'stl' },
      'params.entryHoleDiameterMm',
      /^Entry-hole diameter must be between 22 and 65 mm$/,
    ],
    [
      { templateId: 'bark-trunk', params: { storeys: 3 }, format: 'stl' },
      'params.storeys',
      /^Storeys must be between 1 and 2$/,
    ],
    [
      { templateId: 'gable-box', params: { trimStyle: 'thatch' }, format: 'stl' },
      'params.trimStyle',
      /^Trim must be one of none, shingles, boards$/,
    ],
    [{ templateId: 'gable-box', params: {}, format: 'obj' }, 'format', /^Format must be one of: stl, 3mf\.$/],
    // an entry the default cavity cannot hold: rejected with the range the other parameters allow, not moved
    [
      { templateId: 'round-pod', params: { holeAboveFloorMm: 200 }, format: 'stl' },
      'params.holeAboveFloorMm',
      /^Hole height above floor must be between 60 and 14\d(\.\d)? mm for a 180 × 228 mm body/,
    ],
  ])('answers 400 naming the field and its allowed range: %o', async (body, path, message) => {
    const res = await designer.post('/api/exports').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    expect(res.body.error.message).toMatch(message);
    expect(res.body.error.details[0].path).toBe(path);
  });

  it('keeps answering other requests while an export is being generated', async () => {
    const slow = designer
      .post('/api/exports')
      .send({ templateId: 'bark-trunk', params: { storeys: 2 }, format: 'stl' })
      .buffer(true)
      .parse(binary as never);
    const exportDone = slow.then(() => performance.now());
    // give the request a moment to reach the worker, then ask something else
    await new Promise((resolve) => setTimeout(resolve, 50));
    const health = await designer.get('/api/health');
    const healthAt = performance.now();
    expect(health.status).toBe(200);
    expect((await slow).status).toBe(200);
    expect(healthAt).toBeLessThan(await exportDone);
  }, 60_000);
});

describe('export time limit', () => {
  it('stops a build over the limit with 504, and the same worker then serves the next export', async () => {
    const worker = new ExportWorker(40);
    try {
      const err = await exportDesign(worker, { templateId: 'bark-trunk', params: { storeys: 2 }, format: 'stl' }).catch(
        (e: unknown) => e,
      );
      expect(err).toBeInstanceOf(HttpError);
      expect((err as HttpError).status).toBe(504);
      expect((err as HttpError).code).toBe('generation_timeout');
      expect((err as HttpError).message).toMatch(/longer than 0.04 s/);
      // the stopped thread is replaced on the next call
      const ok = await worker.run('gable-box', {}, { format: 'stl' }, 30_000);
      expect(ok.summary.triangles).toBeGreaterThan(100);
    } finally {
      await worker.close();
    }
  }, 90_000);

  it('reports a failing build in the worker as a typed error, not a crash', async () => {
    const worker = new ExportWorker(30_000);
    try {
      const err = await worker.run('no-such-template', {}, { format: 'stl' }).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(ExportError);
      expect((err as ExportError).kind).toBe('params');
      // the same thread still serves the next request
      // The plate is the seeded first printer's (246 × 238 × 262 mm), passed as the server passes the studio's.
      const plate = { buildVolumeMm: [246, 238, 262] };
      const ok = await worker.run('a-frame', { cleaningAccess: false }, { format: '3mf', plate });
      expect(ok.summary.partCount).toBe(1);
    } finally {
      await worker.close();
    }
  }, 60_000);
});

describe('3MF plate', () => {
  it('refuses a 3MF without a printer plate in words, instead of using a built-in printer', async () => {
    const worker = new ExportWorker(30_000);
    try {
      // A message from an untyped caller: the type requires the plate, the worker checks again.
      const untyped = { format: '3mf' } as unknown as Parameters<ExportWorker['run']>[2];
      const err = await worker.run('a-frame', {}, untyped).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(ExportError);
      expect((err as ExportError).message).toMatch(/printer plate.*choose one of the studio printers/);
    } finally {
      await worker.close();
    }
  }, 60_000);
});

describe('GET /api/templates', () => {
  it('lists every template with its parameters for any signed-in person', async () => {
    const sales = await t.agent('sales');
    const res = await sales.get('/api/templates');
    expect(res.status).toBe(200);
    const ids = res.body.templates.map((template: { id: string }) => template.id);
    expect(ids).toEqual(['gable-box', 'a-frame', 'round-pod', 'bark-trunk']);
    const gable = res.body.templates[0];
    const ridge = gable.parameters.find((p: { key: string }) => p.key === 'ridgeFlatMm');
    // source: issue 3 — ridge strip default 6.35 mm
    expect(ridge).toMatchObject({ unit: 'mm', kind: 'number', default: 6.35 });
    const pitch = gable.parameters.find((p: { key: string }) => p.key === 'roofPitchDeg');
    // source: Mazlan et al., J. Adv. Ind. Tech. & Appl. (UTHM), 2020 — 45° self-supporting limit enforced by the range
    expect(pitch.min).toBe(45);
  });
});
