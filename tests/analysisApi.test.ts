import { describe, expect, it } from 'vitest';
import { AnalysisReportSchema } from '../shared/schemas/analysis';
import { box, geomToMesh, toAsciiStl, toBinaryStl } from './meshFixtures';
import { useTestApp } from './setup/testApp';

const t = useTestApp();

const cubeStl = (): Buffer => Buffer.from(toBinaryStl(geomToMesh(box([0, 0, 0], [20, 20, 20]))));

describe('POST /api/analyses', () => {
  it('returns the report of an uploaded binary STL', async () => {
    const designer = await t.agent('designer');
    const res = await designer.post('/api/analyses').attach('file', cubeStl(), 'cube.stl');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const report = AnalysisReportSchema.parse(res.body);
    expect(report.volumeMm3).toBeCloseTo(8000, 3); // analytic: 20³
    expect(report.watertight).toBe(true);
    expect(report.production.massG).toBeGreaterThan(0);
    expect(report.buildPlate.fits).toBe(true);
  });

  it('takes the orientation, printer, material and infill fields', async () => {
    const designer = await t.agent('designer');
    const tall = Buffer.from(toAsciiStl(geomToMesh(box([0, 0, 0], [10, 20, 40]))));
    const res = await designer
      .post('/api/analyses')
      .field('up', '+x')
      .field('infillPct', '40')
      .attach('file', tall, 'tall.stl');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.bbox.sizeMm[2]).toBeCloseTo(10, 4);
    const auto = await designer.post('/api/analyses').field('up', 'auto').attach('file', tall, 'tall.stl');
    expect(auto.body.orientationSearch.candidates).toHaveLength(26);
    expect(auto.body.bbox.sizeMm[2]).toBeCloseTo(10, 4); // lowest of the zero-support orientations
  });

  it('answers 400 with the reason for malformed files and never crashes', async () => {
    const designer = await t.agent('designer');
    const good = cubeStl();
    const nan = Buffer.from(good);
    nan.writeFloatLE(Number.NaN, 84 + 12);
    const cases: [Buffer, string, string][] = [
      [Buffer.alloc(0), 'empty.stl', 'empty'],
      [good.subarray(0, good.length - 20), 'cut.stl', 'truncated'],
      [Buffer.concat([good, Buffer.alloc(50)]), 'count.stl', 'triangle_count'],
      [nan, 'nan.stl', 'non_finite'],
      [Buffer.from('just some words, not a mesh'), 'words.stl', 'not_a_mesh'],
      [Buffer.from('PK\x03\x04 broken zip'), 'broken.3mf', 'truncated'],
    ];
    for (const [bytes, name, reason] of cases) {
      const res = await designer.post('/api/analyses').attach('file', bytes, name);
      expect(res.status, `${name}: ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.code).toBe('bad_mesh');
      expect(res.body.error.details.reason).toBe(reason);
      expect(res.body.error.message.length).toBeGreaterThan(10);
    }
    const missing = await designer.post('/api/analyses').field('up', '+z');
    expect(missing.status).toBe(400);
    const badPrinter = await designer.post('/api/analyses').field('printerId', 'no-such').attach('file', good, 'c.stl');
    expect(badPrinter.status).toBe(400);
    expect(badPrinter.body.error.message).toMatch(/printerId/);
    const badUp = await designer.post('/api/analyses').field('up', 'sideways').attach('file', good, 'c.stl');
    expect(badUp.status).toBe(400);
    // the server still answers after all that
    expect((await designer.post('/api/analyses').attach('file', good, 'cube.stl')).status).toBe(200);
    expect(t.logs.filter((line) => /error/i.test(line))).toEqual([]);
  });
});
