/**
 * Live parameter limits: every numeric parameter of every template has a range, given the others, inside which
 * parseParams (and the build) always accept a value; the range is tight (one step past it is refused); a refusal
 * caused by the parameter just moved names that parameter; and `POST /api/templates/:id/limits` answers the same.
 * The ranges are our own product rules: common practice, no source.
 */
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { TEMPLATES, describeParameters, findTemplate, generate, liveLimits, parseParams } from '../templates/index';
import { TemplateParamError } from '../templates/lib/TemplateParamError';
import type { AnyTemplate } from '../templates/types';
import { makeTestApp, type TestApp, type TestAgent } from './setup/testApp';

/**
 * A valid parameter set: each numeric parameter in turn takes a value inside its live range given the ones drawn
 * before (so the set stays valid), booleans and choices at random.
 */
function validParams(template: AnyTemplate): fc.Arbitrary<Record<string, unknown>> {
  const described = describeParameters(template);
  const numeric = described.filter((p) => p.kind === 'number');
  const flags: Record<string, fc.Arbitrary<unknown>> = {};
  for (const p of described) {
    if (p.kind === 'boolean') flags[p.key] = fc.boolean();
    if (p.kind === 'choice') flags[p.key] = fc.constantFrom(...(p.options ?? []));
  }
  return fc
    .tuple(
      fc.record(flags),
      fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: numeric.length, maxLength: numeric.length }),
    )
    .map(([chosen, fractions]) => {
      const params: Record<string, unknown> = { ...chosen };
      numeric.forEach((p, i) => {
        const range = liveLimits(template, params)[p.key];
        const value = range.min + fractions[i] * (range.max - range.min);
        params[p.key] = p.step === 1 ? Math.floor(value) : value;
      });
      return params;
    });
}

describe.each(TEMPLATES.map((t) => [t.id, t] as const))('live limits of %s', (_id, template) => {
  const numeric = describeParameters(template).filter((p) => p.kind === 'number');

  it('gives a range for every numeric parameter, inside the declared one', () => {
    const limits = liveLimits(template, {});
    expect(Object.keys(limits).sort()).toEqual(numeric.map((p) => p.key).sort());
    for (const p of numeric) {
      expect(limits[p.key].min).toBeGreaterThanOrEqual(p.min as number);
      expect(limits[p.key].max).toBeLessThanOrEqual(p.max as number);
      expect(limits[p.key].min).toBeLessThanOrEqual(limits[p.key].max);
    }
  });

  it('accepts, through parseParams, any value of one parameter inside its live range, the others as they are', () => {
    fc.assert(
      fc.property(
        validParams(template),
        fc.constantFrom(...numeric),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (params, param, fraction) => {
          const range = liveLimits(template, params)[param.key];
          expect(range.min).toBeLessThanOrEqual(params[param.key] as number);
          expect(range.max).toBeGreaterThanOrEqual(params[param.key] as number);
          const raw = range.min + fraction * (range.max - range.min);
          const value = param.step === 1 ? Math.round(raw) : raw;
          expect(() => parseParams(template, { ...params, [param.key]: value })).not.toThrow();
          // Tight: one step beyond a narrowed end is refused.
          const step = param.step ?? 1;
          if (range.max + step <= (param.max as number)) {
            expect(() => parseParams(template, { ...params, [param.key]: range.max + step })).toThrow(
              TemplateParamError,
            );
          }
          if (range.min - step >= (param.min as number)) {
            expect(() => parseParams(template, { ...params, [param.key]: range.min - step })).toThrow(
              TemplateParamError,
            );
          }
        },
      ),
      { numRuns: 60, seed: 20261202 },
    );
  });

  it('builds a closed model at the ends of the live ranges (2 random sets)', async () => {
    const sets = fc.sample(validParams(template), { numRuns: 2, seed: 7 });
    for (const params of sets) {
      const limits = liveLimits(template, params);
      const key = numeric[sets.indexOf(params) % numeric.length].key;
      for (const end of [limits[key].min, limits[key].max]) {
        const result = await generate(template.id, { ...params, [key]: end });
        expect(result.triangles).toBeGreaterThan(0);
      }
    }
  }, 120_000);
});

describe('a refused value names the parameter that was moved', () => {
  const pod = findTemplate('round-pod') as AnyTemplate;

  it('round pod: thicker walls that push the entry under the ceiling name the wall thickness and its range', () => {
    let error: unknown;
    try {
      parseParams(pod, { wallThicknessMm: 19.5 }, { moved: 'wallThicknessMm' });
    } catch (err) {
      error = err;
    }
    expect(error).toBeInstanceOf(TemplateParamError);
    const { field, message } = error as TemplateParamError;
    expect(field).toBe('wallThicknessMm');
    expect(message).toMatch(/^Wall thickness of 19\.5 mm leaves hole height above floor \(130 mm\) out of range/);
    const max = liveLimits(pod, { wallThicknessMm: 19.5 }).wallThicknessMm.max;
    expect(message).toContain(`Keep wall thickness between 4 mm and ${max} mm`);
    // No field keys in what a person reads.
    expect(message).not.toMatch(/[a-z]+[A-Z][a-zA-Z]*Mm/);
  });

  it('without a moved parameter, the refused one is named by its label', () => {
    expect(() => parseParams(pod, { wallThicknessMm: 19.5 })).toThrow(
      /^Hole height above floor must be between 60 and/,
    );
  });
});

describe('POST /api/templates/:id/limits', () => {
  let t: TestApp;
  let designer: TestAgent;
  beforeAll(async () => {
    t = await makeTestApp();
    designer = await t.agent('designer');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('answers a { min, max } for every numeric parameter, the same as the shared function', async () => {
    const params = { wallThicknessMm: 14, bodyDiameterMm: 170 };
    const res = await designer.post('/api/templates/round-pod/limits').send({ params });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ limits: liveLimits(findTemplate('round-pod') as AnyTemplate, params) });
    expect(res.body.limits.holeAboveFloorMm.max).toBeLessThan(220);
  });

  it('answers 404 for an unknown template', async () => {
    const res = await designer.post('/api/templates/dovecote/limits').send({ params: {} });
    expect(res.status).toBe(404);
  });
});
