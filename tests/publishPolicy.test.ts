/**
 * Publishing with acknowledged findings: some findings block publishing even when acknowledged (no drainage: RSPB,
 * BTO and NABU ask for floor holes; no ventilation: Cornell Lab of Ornithology nest-box features), the others are
 * stated on the spec sheet as acknowledged limits with the studio's reason. The decisions are the README's table.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PUBLISH_POLICY, publishBlockers, publishRefusal, studioReason } from '../shared/families/publishPolicy';
import { GateWarningCodeSchema, type GateWarning } from '../shared/schemas/gate';
import type { CatalogueVariant } from '../shared/schemas/catalogue';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { variantCautions } from '../server/services/specSheetCautions';
import { DEFAULT_MATERIALS } from '../shared/production/defaults';

/** The seed materials, as a new database holds them. */
const MATERIALS = new Map(DEFAULT_MATERIALS.map((m) => [m.id, m]));
import { acknowledgeAll, computeNow, createTestFamily, smallFamilyBody } from './familiesFixtures';
import { catalogueVariantFixture } from './salesFixtures';
import { makeTestApp, type TestApp } from './setup/testApp';

const warning = (code: GateWarning['code'], acknowledged: boolean): GateWarning => ({
  code,
  severity: 'warning',
  message: `${code} message`,
  source: 'test',
  skus: ['FH-T-1'],
  acknowledgement: acknowledged
    ? { code, text: 'Reviewed.', by: { id: 'p', name: 'Maren' }, at: '2026-12-01T10:00:00.000Z' }
    : null,
});

describe('publish policy', () => {
  it('decides every finding the gate can raise', () => {
    const codes = GateWarningCodeSchema.options.flatMap((o) => o.options) as GateWarning['code'][];
    expect(codes.length).toBeGreaterThan(10);
    for (const code of codes) expect(PUBLISH_POLICY[code]?.treatment, code).toMatch(/^(block|state)$/);
  });

  it('blocks on acknowledged drainage and ventilation findings, states thin walls and heat', () => {
    const blocked = publishBlockers([
      warning('no-drainage', true),
      warning('thin-walls', true),
      warning('outdoor-heat', true),
      warning('no-ventilation', false),
    ]);
    expect(blocked.map((w) => w.code)).toEqual(['no-drainage', 'no-ventilation']);
    const text = publishRefusal(blocked);
    expect(text).toMatch(/^This family cannot be published: no drainage \(FH-T-1\)/);
    expect(text).toMatch(/An acknowledgement does not lift this/);
    expect(text).not.toMatch(/no-drainage|_/);
  });
});

describe('publishing through the API', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await makeTestApp();
  });
  afterAll(async () => {
    await familyJobs(t.ctx).close();
    await t.close();
  });

  async function throughReview(body = smallFamilyBody()) {
    const family = await createTestFamily(t, body);
    await computeNow(t, family.id);
    await acknowledgeAll(t, family.id);
    const submit = await (await t.agent('designer')).post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status).toBe(200);
    const manager = await t.agent('catalogue_manager');
    expect((await manager.post(`/api/families/${family.id}/approve`).send({})).status).toBe(200);
    return { id: family.id, manager };
  }

  it('refuses to publish a box without drainage holes even when acknowledged', async () => {
    const body = smallFamilyBody({ baseParams: { cavityDepthMm: 160, holeAboveFloorMm: 125, drainageHoles: 0 } });
    const { id, manager } = await throughReview(body);
    const res = await manager.post(`/api/families/${id}/publish`).send({});
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('publish_blocked');
    expect(res.body.error.message).toMatch(/no drainage/);
    expect(res.body.error.message).toMatch(/nestlings can chill or drown/);
  }, 180_000);

  it('publishes a box whose acknowledged findings are all of the stated kind', async () => {
    const { id, manager } = await throughReview();
    const res = await manager.post(`/api/families/${id}/publish`).send({});
    expect(res.status).toBe(200);
  }, 180_000);
});

describe('the spec sheet states an acknowledged limit with the studio’s reason', () => {
  let variant: CatalogueVariant;
  beforeAll(async () => {
    variant = await catalogueVariantFixture({ sku: 'FH-T-ACK', templateId: 'gable-box' });
  }, 60_000);

  it('titles the finding as an acknowledged limit and quotes the reason', () => {
    const reason = 'Every listing says to hang the box in shade, facing north to east.';
    const acked = {
      ...variant,
      acknowledgements: [
        { code: 'thin-walls' as const, text: reason, by: { id: 'p', name: 'Maren' }, at: '2026-12-01T10:00:00Z' },
      ],
    };
    const caution = variantCautions(acked, MATERIALS).find((c) => c.title.startsWith('Acknowledged limit: thin walls'));
    expect(caution).toBeDefined();
    expect(caution!.text).toContain(studioReason(reason));
    // Without the acknowledgement the finding is a plain caution.
    expect(variantCautions(variant, MATERIALS).some((c) => c.title.startsWith('Acknowledged limit'))).toBe(false);
  });
});
