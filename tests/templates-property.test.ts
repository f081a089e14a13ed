/**
 * Property test: random parameter sets inside the declared ranges always give a closed, 2-manifold mesh with the
 * expected number of bodies (manifold-3d and Debian's admesh), resting on the build plate, at full quality and as the
 * draft the editor shows while a slider is held. Runs are bounded to keep the suite fast.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { TEMPLATES, describeParameters, generate, generateDraft } from '../templates/index';
import type { AnyTemplate } from '../templates/types';
import type { IndexedMesh } from '../shared/schemas/mesh';
import { admeshReport, manifoldReport } from './templates.meshCheck';

const RUNS_PER_TEMPLATE = 20;

/** An arbitrary over a template's whole parameter space, read from its own description. */
function paramsArbitrary(template: AnyTemplate): fc.Arbitrary<Record<string, unknown>> {
  const fields: Record<string, fc.Arbitrary<unknown>> = {};
  for (const p of describeParameters(template)) {
    if (p.kind === 'boolean') fields[p.key] = fc.boolean();
    else if (p.kind === 'choice') fields[p.key] = fc.constantFrom(...(p.options ?? []));
    else if (p.step === 1 && Number.isInteger(p.min) && Number.isInteger(p.max)) {
      fields[p.key] = fc.integer({ min: p.min as number, max: p.max as number });
    } else {
      fields[p.key] = fc.double({ min: p.min as number, max: p.max as number, noNaN: true, noDefaultInfinity: true });
    }
  }
  // The entry height is drawn inside the range the other parameters allow (template.limits), as a fraction of it;
  // combinations with no allowed entry height are skipped (parseParams rejects them by name, tested elsewhere).
  const { holeAboveFloorMm: _hole, ...others } = fields;
  return fc.tuple(fc.record(others), fc.double({ min: 0, max: 1, noNaN: true })).map(([params, fraction]) => {
    const parsed = template.parameters.parse({ ...params, holeAboveFloorMm: 60 });
    const declared = describeParameters(template).find((p) => p.key === 'holeAboveFloorMm');
    const lo = declared?.min ?? 0;
    const hi = Math.min(declared?.max ?? Infinity, template.limits?.(parsed).holeAboveFloorMm?.maxMm ?? Infinity);
    return { ...params, holeAboveFloorMm: hi < lo ? -1 : Math.floor(lo + fraction * (hi - lo)) };
  });
}

/**
 * Checks one mesh with both outside tools: manifold-3d (status, bodies) and admesh --exact (no open edges, no facet
 * to reverse, the same number of parts). source: manifold-3d; Debian's admesh 0.98.
 */
async function expectClosedManifold(mesh: IndexedMesh, bodies: number): Promise<number> {
  const report = await manifoldReport(mesh);
  expect(report.status).toBe('NoError');
  expect(report.bodies).toBe(bodies);
  const admesh = await admeshReport(mesh);
  expect(admesh.edgesFixed).toBe(0);
  expect(admesh.backwardsEdges).toBe(0);
  expect(admesh.facetsReversed).toBe(0);
  expect(admesh.parts).toBe(bodies);
  expect(admesh.disconnectedFacets).toBe(0);
  return report.volumeMm3;
}

describe.each(TEMPLATES.map((t) => [t.id, t] as const))('template %s over random parameters', (_id, template) => {
  it(`stays closed and manifold with the expected bodies (${RUNS_PER_TEMPLATE} runs)`, async () => {
    await fc.assert(
      fc.asyncProperty(paramsArbitrary(template), async (params) => {
        fc.pre((params.holeAboveFloorMm as number) >= 0);
        const result = await generate(template.id, params);
        // The entry sits where the parameter says: no silent clamping.
        expect(result.facts.holeAboveFloorMm).toBeCloseTo(params.holeAboveFloorMm as number, 6);
        const expectedBodies = template.id === 'gable-box' || result.params.cleaningAccess ? 2 : 1;
        const volumeMm3 = await expectClosedManifold(result.mesh, expectedBodies);
        expect(Math.abs(volumeMm3 - result.volumeMm3) / volumeMm3).toBeLessThan(1e-4);
        // The draft is a coarser mesh of the same design: closed, manifold, the same bodies, within a few % of volume.
        const draft = await generateDraft(template.id, params);
        const draftVolumeMm3 = await expectClosedManifold(draft.mesh, expectedBodies);
        expect(Math.abs(draftVolumeMm3 - volumeMm3) / volumeMm3).toBeLessThan(0.05);
        expect(draft.facts).toEqual(result.facts);
        let minZ = Infinity;
        for (let i = 2; i < result.mesh.positions.length; i += 3) minZ = Math.min(minZ, result.mesh.positions[i]);
        expect(minZ).toBeCloseTo(0, 3);
      }),
      // endOnFailure: report the counterexample at once (shrinking a 1 s build takes minutes)
      { numRuns: RUNS_PER_TEMPLATE, seed: 20261201, endOnFailure: true },
    );
  }, 240_000);
});
