/**
 * Families API: variant matrix and SKUs, bad input, the family gate, the review workflow and its 409s, concurrent
 * reviewers, revisions of a published family with their diff, progress events, cancel, and the audit log.
 * Workflow rules are our own product decisions (PRODUCT.md, issue 5): no outside source. Geometry checks of computed
 * variants use manifold-3d (outside library) and the template's own generate() hash.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { buildVariantMatrix, variantCount } from '../shared/families/variantMatrix';
import { axisValueCode, skuFor } from '../shared/families/sku';
import { FAMILY_MAX_VARIANTS, SkuSchema } from '../shared/schemas/familySpec';
import { type Variant } from '../shared/schemas/variant';
import { type Family } from '../shared/schemas/family';
import { findTemplate, generate } from '../templates/index';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { currentRevisionId } from '../server/services/families/familyQueries';
import { acknowledgeAll, computeNow, createTestFamily, familyInState, smallFamilyBody } from './familiesFixtures';
import { useTestApp } from './setup/testApp';
import { manifoldReport } from './templates.meshCheck';

const t = useTestApp();
afterAll(async () => {
  await familyJobs(t.ctx).close();
});

async function variantsOf(id: string, query = 'pageSize=500'): Promise<{ variants: Variant[]; total: number }> {
  const res = await (await t.agent('designer')).get(`/api/families/${id}/variants?${query}`);
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body;
}

describe('variant matrix and SKUs (pure)', () => {
  const axes = [
    { kind: 'param' as const, key: 'entryHoleDiameterMm', values: [25, 28, 32] },
    { kind: 'param' as const, key: 'trimStyle', values: ['none', 'shingles'] },
    { kind: 'attribute' as const, key: 'colour' as const, values: ['sand', 'moss-green'] },
  ];

  it('is the cartesian product, every SKU unique and following the scheme', () => {
    const cells = buildVariantMatrix({
      familyCode: 'HGB',
      axes,
      baseParams: { cavityDepthMm: 160 },
      materialId: 'pla',
    });
    // 3 × 2 × 2 = 12 (arithmetic)
    expect(cells).toHaveLength(12);
    expect(variantCount(axes)).toBe(12);
    expect(new Set(cells.map((c) => c.sku)).size).toBe(12);
    expect(new Set(cells.map((c) => c.variantKey)).size).toBe(12);
    for (const cell of cells) expect(cell.sku).toMatch(/^FH-HGB-(25|28|32)-(NONE|SHIN)-(SAND|MOSS)$/);
    const one = cells.find((c) => c.sku === 'FH-HGB-28-SHIN-MOSS');
    expect(one?.params).toEqual({ cavityDepthMm: 160, entryHoleDiameterMm: 28, trimStyle: 'shingles' });
    expect(one?.attributes).toEqual({ colour: 'moss-green', material: 'pla', finish: null });
  });

  it('keeps a variant SKU when values are added to an axis', () => {
    const before = buildVariantMatrix({ familyCode: 'HGB', axes, baseParams: {}, materialId: 'pla' });
    const wider = axes.map((axis) =>
      axis.key === 'entryHoleDiameterMm' ? { ...axis, values: [25, 27.5, 28, 32] } : axis,
    );
    const after = buildVariantMatrix({ familyCode: 'HGB', axes: wider, baseParams: {}, materialId: 'pla' });
    const skuByKey = new Map(after.map((cell) => [cell.variantKey, cell.sku]));
    for (const cell of before) expect(skuByKey.get(cell.variantKey)).toBe(cell.sku);
    expect(after.map((c) => c.sku)).toContain('FH-HGB-27P5-NONE-SAND');
  });

  it('codes values by themselves', () => {
    expect(axisValueCode(27.5)).toBe('27P5');
    expect(axisValueCode(true)).toBe('Y');
    expect(axisValueCode('uv-clear-coat')).toBe('UVCL');
    expect(skuFor('AB', [], {})).toBe('FH-AB');
  });
});

describe('creating a family', () => {
  it('stores the matrix with unique SKUs and complete template parameters', async () => {
    const body = smallFamilyBody({
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [25, 28, 32] },
        { kind: 'param', key: 'trimStyle', values: ['none', 'shingles'] },
        { kind: 'attribute', key: 'colour', values: ['sand', 'moss-green'] },
      ],
    });
    const family = await createTestFamily(t, body);
    expect(family.state).toBe('draft');
    expect(family.revision).toBe(1);
    // the template's current version (bumped whenever the same parameters give another mesh)
    expect(family.templateVersion).toBe(findTemplate(family.templateId)?.version);
    expect(family.variantCount).toBe(12);
    expect(family.gate.ok).toBe(false);
    expect(family.gate.blockers.map((b) => b.code)).toContain('not_computed');
    const { variants, total } = await variantsOf(family.id);
    expect(total).toBe(12);
    expect(new Set(variants.map((v) => v.sku)).size).toBe(12);
    for (const variant of variants) {
      expect(variant.status).toBe('pending');
      // defaults merged: a key the family never set is present with the template default
      expect(variant.params.wallThicknessMm).toBe(10);
      expect(variant.params.cavityDepthMm).toBe(160);
    }
    const filtered = await variantsOf(family.id, 'q=shin&sort=sku&dir=desc&pageSize=4&page=2');
    expect(filtered.total).toBe(6);
    expect(filtered.variants).toHaveLength(2);
    expect(filtered.variants.every((v) => v.sku.includes('SHIN'))).toBe(true);
    // sorted by SKU descending, page 2 of 4 per page: the 5th and 6th of the six shingle SKUs
    const shingles = variants
      .map((v) => v.sku)
      .filter((sku) => sku.includes('SHIN'))
      .sort()
      .reverse();
    expect(filtered.variants.map((v) => v.sku)).toEqual(shingles.slice(4, 6));
  });

  it('refuses a code in use with 409', async () => {
    const res = await (await t.agent('designer')).post('/api/families').send(smallFamilyBody({ code: 'HGB' }));
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('code_taken');
    // Written for people and pointed at the field, so the editor shows it beside the SKU code input.
    expect(res.body.error.message).toBe('Another family already uses the code HGB: choose another.');
    expect(res.body.error.details).toEqual([{ in: 'body', path: 'code', message: res.body.error.message }]);
  });
});

describe('bad input: 400 naming the field', () => {
  const cases: Array<{ label: string; axes: unknown; field: string; includes?: string }> = [
    {
      label: 'unknown axis key',
      axes: [{ kind: 'param', key: 'chimneyHeightMm', values: [10] }],
      field: 'axes.0.key',
      includes: 'not a parameter of gable-box',
    },
    {
      label: 'out-of-range value',
      axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [28, 99] }],
      field: 'axes.0.values.1',
      includes: 'between 22 and 65',
    },
    { label: 'empty axis', axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [] }], field: 'axes.0.values' },
    {
      label: 'duplicate values',
      axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32, 28] }],
      field: 'axes.0.values.2',
      includes: 'duplicate',
    },
    {
      label: 'duplicate axis',
      axes: [
        { kind: 'attribute', key: 'colour', values: ['sand'] },
        { kind: 'attribute', key: 'colour', values: ['white'] },
      ],
      field: 'axes.1.key',
    },
    {
      label: 'a colour the material does not come in',
      axes: [{ kind: 'attribute', key: 'colour', values: ['sand', 'tangerine'] }],
      field: 'axes.0.values.1',
      includes: 'does not come in',
    },
    {
      label: 'two values with the same SKU code',
      axes: [{ kind: 'attribute', key: 'finish', values: ['matte-coat', 'matte-clear'] }],
      field: 'axes.0.values.1',
      includes: 'SKU code',
    },
  ];
  it.each(cases)('$label', async ({ axes, field, includes }) => {
    const res = await (await t.agent('designer')).post('/api/families').send({ ...smallFamilyBody(), axes });
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
    const paths = (res.body.error.details ?? []).map((d: { path: string }) => d.path);
    expect(paths.includes(field) || res.body.error.message.startsWith(`${field}:`), res.body.error.message).toBe(true);
    if (includes) expect(res.body.error.message).toContain(includes);
  });

  it('names the count when the matrix is over the limit', async () => {
    const wide = (key: string, count: number, from: number) => ({
      kind: 'param',
      key,
      values: Array.from({ length: count }, (_, i) => from + i),
    });
    // 30 × 20 = 600 variants > 500 (arithmetic)
    const axes = [wide('entryHoleDiameterMm', 30, 25), wide('floorWidthMm', 20, 100)];
    const res = await (await t.agent('designer')).post('/api/families').send({ ...smallFamilyBody(), axes });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toContain('600 variants');
    expect(res.body.error.message).toContain(String(FAMILY_MAX_VARIANTS));
  });

  it('names a bad base parameter', async () => {
    const res = await (
      await t.agent('designer')
    )
      .post('/api/families')
      .send({ ...smallFamilyBody(), baseParams: { wallThicknessMm: 2 } });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^baseParams\.wallThicknessMm: /);
  });
});

describe('computing and the family gate', () => {
  it('computes every variant, blocks over-budget variants and unacknowledged warnings, and lets a clean family through', async () => {
    const family = await createTestFamily(
      t,
      smallFamilyBody({
        axes: [
          { kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] },
          { kind: 'attribute', key: 'colour', values: ['sand', 'white'] },
        ],
        supportBudgetMm3: 5_000,
      }),
    );
    await computeNow(t, family.id);
    const { variants } = await variantsOf(family.id);
    expect(variants).toHaveLength(4);
    for (const variant of variants) {
      expect(variant.status, variant.error ?? '').toBe('done');
      expect(variant.report?.watertight).toBe(true);
      expect(variant.report?.openEdges).toBe(0);
      expect(variant.report?.nonManifoldEdges).toBe(0);
      expect(variant.report?.fitsPrinter).toBe(true);
      expect(variant.cost!.costCents).toBe(variant.cost!.breakdown.totalCents);
      expect(variant.sha256).toMatch(/^[0-9a-f]{64}$/);
    }
    // Colour does not change the mesh: same hash for the two colours of one entry size.
    const hashes = (entry: number) =>
      new Set(variants.filter((v) => v.axisValues.entryHoleDiameterMm === entry).map((v) => v.sha256));
    expect(hashes(28).size).toBe(1);
    expect(hashes(32).size).toBe(1);

    // Outside check: the stored hash is the template's own for the stored parameters, and manifold-3d accepts the mesh.
    const sample = variants[0];
    const rebuilt = await generate('gable-box', sample.params);
    expect(rebuilt.sha256).toBe(sample.sha256);
    const manifold = await manifoldReport(rebuilt.mesh);
    expect(manifold.status).toBe('NoError');
    expect(manifold.volumeMm3).toBeCloseTo(sample.report!.volumeMm3, -2);

    const designer = await t.agent('designer');
    let current = (await designer.get(`/api/families/${family.id}`)).body.family as Family;
    const over = current.gate.blockers.find((b) => b.code === 'over_support_budget');
    const overSkus = variants.filter((v) => v.report!.supportVolumeMm3 > 5_000).map((v) => v.sku);
    expect(overSkus.length).toBeGreaterThan(0);
    expect(overSkus.length).toBeLessThan(4);
    expect(over?.skus.sort()).toEqual(overSkus.sort());
    for (const v of variants) expect(v.verdict).toBe(v.report!.supportVolumeMm3 > 5_000 ? 'fail' : 'warn');

    let submit = await designer.post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status).toBe(409);
    expect(submit.body.error.code).toBe('gate_failed');
    expect(submit.body.error.details.blockers.map((b: { code: string }) => b.code)).toContain('over_support_budget');

    // Raise the budget above every variant: the edit resets the results, a recompute clears the budget blocker.
    const patched = await designer.patch(`/api/families/${family.id}`).send({ supportBudgetMm3: 20_000 });
    expect(patched.status).toBe(200);
    expect(patched.body.family.compute.state).toBe('idle');
    await computeNow(t, family.id);
    current = (await designer.get(`/api/families/${family.id}`)).body.family as Family;
    expect(current.gate.blockers.map((b) => b.code)).toEqual(['birdfit_unacknowledged']);
    // source: BTO / Which? — timber walls of at least 15 mm; the 10 mm printed wall is flagged
    expect(current.gate.warnings.find((w) => w.code === 'thin-walls')?.severity).toBe('warning');
    submit = await designer.post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status).toBe(409);

    const tooShort = await designer
      .post(`/api/families/${family.id}/acknowledgements`)
      .send({ acknowledgements: [{ code: 'thin-walls', text: 'ok' }] });
    expect(tooShort.status).toBe(400);
    expect(tooShort.body.error.details[0].path).toBe('acknowledgements.0.text');

    current = await acknowledgeAll(t, family.id);
    expect(current.gate.ok).toBe(true);
    // The rows no longer ask for acknowledgements the gate has (for the reviewer too): they say what was acknowledged.
    for (const role of ['designer', 'catalogue_manager'] as const) {
      const rows = (await (await t.agent(role)).get(`/api/families/${family.id}/variants`)).body.variants as Variant[];
      for (const row of rows) {
        expect(row.reasons.join('; ')).not.toMatch(/to acknowledge/);
        expect(row.reasons.join('; ')).toMatch(/bird-fit warnings acknowledged in writing: thin walls/);
      }
    }
    const ack = current.acknowledgements.find((a) => a.code === 'thin-walls');
    expect(ack?.by.name).toBe('Maren Hale');
    expect(Date.parse(ack!.at)).not.toBeNaN();
    submit = await designer.post(`/api/families/${family.id}/submit`).send({});
    expect(submit.status, JSON.stringify(submit.body)).toBe(200);
    expect(submit.body.family.state).toBe('in_review');
  });

  it('sends progress events per variant over SSE and a done event at the end', async () => {
    const family = await createTestFamily(
      t,
      smallFamilyBody({ axes: [{ kind: 'attribute', key: 'colour', values: ['sand', 'white', 'black'] }] }),
    );
    const designer = await t.agent('designer');
    const started = await designer.post(`/api/families/${family.id}/compute`).send({});
    expect(started.status).toBe(202);
    expect(['queued', 'running']).toContain(started.body.state);
    const res = await designer
      .get(`/api/families/${family.id}/progress`)
      .buffer(true)
      .parse((response, done) => {
        let text = '';
        response.on('data', (chunk: Buffer) => (text += chunk.toString()));
        response.on('end', () => done(null, text));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/event-stream');
    const events = String(res.body)
      .trim()
      .split('\n\n')
      .map((block) => ({
        event: /^event: (.*)$/m.exec(block)?.[1],
        data: JSON.parse(/^data: (.*)$/m.exec(block)?.[1] ?? 'null'),
      }));
    const last = events.at(-1)!;
    expect(last.event).toBe('done');
    expect(last.data).toMatchObject({ state: 'done', doneCount: 3, total: 3, revision: 1 });
    const perVariant = events.filter((e) => e.data.variant);
    // The stream may join after the first variants: the per-variant counts it saw are the last ones, in order.
    const counts = perVariant.map((e) => e.data.doneCount as number);
    expect(counts).toEqual([1, 2, 3].slice(3 - counts.length));
    expect(perVariant.every((e) => ['pass', 'warn', 'fail'].includes(e.data.variant.verdict))).toBe(true);
  });

  it('cancels a running computation', async () => {
    const family = await createTestFamily(
      t,
      smallFamilyBody({
        axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [25, 26, 27, 28, 29, 30, 31, 32] }],
      }),
    );
    const designer = await t.agent('designer');
    expect((await designer.post(`/api/families/${family.id}/compute`).send({})).status).toBe(202);
    const cancelled = await designer.post(`/api/families/${family.id}/cancel`).send({});
    expect(cancelled.status).toBe(200);
    expect(cancelled.body.state).toBe('cancelled');
    await familyJobs(t.ctx).idle();
    const after = (await designer.get(`/api/families/${family.id}`)).body.family as Family;
    expect(after.compute.state).toBe('cancelled');
    expect(after.compute.doneCount).toBeLessThan(8);
    expect(after.gate.blockers.map((b) => b.code)).toContain('not_computed');
    expect(await familyJobs(t.ctx).isActive(await currentRevisionId(t.ctx, family.id))).toBe(false);
  });
});

describe('review workflow', () => {
  it('answers 409 with the reason for a step the state does not allow, 403 for the wrong role', async () => {
    const draft = await createTestFamily(t);
    const manager = await t.agent('catalogue_manager');
    const publish = await manager.post(`/api/families/${draft.id}/publish`).send({});
    expect(publish.status).toBe(409);
    expect(publish.body.error.code).toBe('invalid_state');
    expect(publish.body.error.message).toContain('cannot publish a family that is draft');
    const approve = await manager.post(`/api/families/${draft.id}/approve`).send({});
    expect(approve.status).toBe(409);
    const designer = await t.agent('designer');
    const byDesigner = await designer.post(`/api/families/${draft.id}/publish`).send({});
    expect(byDesigner.status).toBe(403);
    const sales = await t.agent('sales');
    expect((await sales.get(`/api/families/${draft.id}`)).status).toBe(403);
  });

  it('returns a family with comments to draft, and the designer sees them', async () => {
    const family = await familyInState(t, 'in_review');
    const manager = await t.agent('catalogue_manager');
    expect((await manager.post(`/api/families/${family.id}/return`).send({})).status).toBe(400);
    const res = await manager
      .post(`/api/families/${family.id}/return`)
      .send({ comments: 'The 32 mm variant needs a photo of the floor plug.' });
    expect(res.status).toBe(200);
    const back = res.body.family as Family;
    expect(back.state).toBe('draft');
    expect(back.comments.at(-1)).toMatchObject({
      action: 'return',
      text: 'The 32 mm variant needs a photo of the floor plug.',
    });
    expect(back.comments.at(-1)?.by.name).toBe('Tobias Reyne');
    const designerView = (await (await t.agent('designer')).get(`/api/families/${family.id}`)).body.family as Family;
    expect(designerView.allowedActions).toEqual(['submit']);
  });

  it('lets one of two reviewers approving at once win; the other gets 409 and nothing is half-written', async () => {
    const family = await familyInState(t, 'in_review');
    const first = await t.agent('catalogue_manager');
    const second = await t.agent('catalogue_manager', { fresh: true });
    const results = await Promise.all([
      first.post(`/api/families/${family.id}/approve`).send({ comment: 'first', expectedLock: family.lock }),
      second.post(`/api/families/${family.id}/approve`).send({ comment: 'second', expectedLock: family.lock }),
    ]);
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([200, 409]);
    const loser = results.find((r) => r.status === 409)!;
    expect(['state_changed', 'invalid_state']).toContain(loser.body.error.code);
    const audit = (await first.get(`/api/families/${family.id}/audit`)).body.events as Array<{ action: string }>;
    expect(audit.filter((e) => e.action === 'family.approved')).toHaveLength(1);
    const after = (await first.get(`/api/families/${family.id}`)).body.family as Family;
    expect(after.state).toBe('approved');
    expect(after.comments.filter((c) => c.action === 'approve')).toHaveLength(1);
  });

  it('makes a new revision of a published family, keeps the published one in the catalogue until the new one is published, and diffs them', async () => {
    const family = await familyInState(t, 'published');
    const designer = await t.agent('designer');
    const manager = await t.agent('catalogue_manager');
    const sales = await t.agent('sales');
    const skusInCatalogue = async () =>
      (
        (await sales.get(`/api/catalogue?familyId=${family.id}`)).body.variants as Array<{
          sku: string;
          revision: number;
        }>
      )
        .map((v) => `${v.revision}:${v.sku}`)
        .sort();
    expect(await skusInCatalogue()).toEqual([`1:FH-${family.code}-28-SAND`]);

    const patched = await designer.patch(`/api/families/${family.id}`).send({
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] },
        { kind: 'attribute', key: 'colour', values: ['sand'] },
      ],
      baseParams: { cavityDepthMm: 165, holeAboveFloorMm: 125, wallThicknessMm: 10 },
    });
    expect(patched.status, JSON.stringify(patched.body)).toBe(200);
    const revised = patched.body.family as Family;
    expect(revised.revision).toBe(2);
    expect(revised.state).toBe('draft');
    expect(revised.publishedRevision).toBe(1);
    expect(revised.revisions.map((r) => `${r.number}:${r.state}`)).toEqual(['1:published', '2:draft']);
    expect(await skusInCatalogue()).toEqual([`1:FH-${family.code}-28-SAND`]);

    const diff = await designer.get(`/api/families/${family.id}/diff?from=1&to=2`);
    expect(diff.status).toBe(200);
    // only the key that changed: keys left at the template default on one side and spelled out on the other are equal
    expect(diff.body.fields).toEqual([{ field: 'baseParams.cavityDepthMm', from: 160, to: 165 }]);
    expect(diff.body.axes).toContainEqual({
      key: 'entryHoleDiameterMm',
      kind: 'param',
      change: 'changed',
      addedValues: [32],
      removedValues: [],
    });
    expect(diff.body.variantCount).toEqual({ from: 1, to: 2 });
    expect((await designer.get(`/api/families/${family.id}/diff?from=1&to=9`)).status).toBe(404);

    // A second edit of the new draft changes it in place (no third revision).
    const again = await designer.patch(`/api/families/${family.id}`).send({ name: 'Test Gable II' });
    expect(again.body.family.revision).toBe(2);

    await computeNow(t, family.id);
    await acknowledgeAll(t, family.id);
    expect((await designer.post(`/api/families/${family.id}/submit`).send({})).status).toBe(200);
    expect((await manager.post(`/api/families/${family.id}/approve`).send({})).status).toBe(200);
    expect(await skusInCatalogue()).toEqual([`1:FH-${family.code}-28-SAND`]);
    const published = await manager.post(`/api/families/${family.id}/publish`).send({});
    expect(published.status).toBe(200);
    expect(
      published.body.family.revisions.map((r: { number: number; state: string }) => `${r.number}:${r.state}`),
    ).toEqual(['1:retired', '2:published']);
    expect(await skusInCatalogue()).toEqual([`2:FH-${family.code}-28-SAND`, `2:FH-${family.code}-32-SAND`]);

    const retired = await manager.post(`/api/families/${family.id}/retire`).send({});
    expect(retired.status).toBe(200);
    expect(retired.body.family.publishedRevision).toBeNull();
    expect(await skusInCatalogue()).toEqual([]);
    const retireAgain = await manager.post(`/api/families/${family.id}/retire`).send({});
    expect(retireAgain.status).toBe(409);
  });

  it('refuses edits while in review and records every action in the audit log', async () => {
    const family = await familyInState(t, 'in_review');
    const designer = await t.agent('designer');
    const edit = await designer.patch(`/api/families/${family.id}`).send({ name: 'Sneaky rename' });
    expect(edit.status).toBe(409);
    expect(edit.body.error.code).toBe('invalid_state');
    const stale = await designer.patch(`/api/families/${family.id}`).send({ expectedLock: family.lock + 5 });
    expect(stale.status).toBe(409);
    const audit = await designer.get(`/api/families/${family.id}/audit`);
    expect(audit.status).toBe(200);
    const actions = (audit.body.events as Array<{ action: string; actor: { name: string } | null }>).map(
      (e) => e.action,
    );
    // newest first: created, acknowledged, submitted happened in that order
    expect(actions).toEqual(['family.submitted', 'family.acknowledged', 'family.created']);
    expect(audit.body.events[0].actor.name).toBe('Maren Hale');
  });

  it('lists families for designers and catalogue managers with a state filter', async () => {
    const manager = await t.agent('catalogue_manager');
    const res = await manager.get('/api/families?state=in_review');
    expect(res.status).toBe(200);
    const codes = (res.body.families as Array<{ code: string; state: string }>).map((f) => f.code);
    expect(codes).toContain('CAF');
    expect(res.body.families.every((f: { state: string }) => f.state === 'in_review')).toBe(true);
    expect((await manager.get('/api/families?state=nonsense')).status).toBe(400);
  });

  it('shows in the list the same gate and variant count as the page of each family', async () => {
    const manager = await t.agent('catalogue_manager');
    const list = (await manager.get('/api/families')).body.families as Array<{
      id: string;
      gateOk: boolean;
      variantCount: number;
    }>;
    // The demo has a published family (gate open), one in review and a draft never computed (gate closed).
    expect(new Set(list.map((row) => row.gateOk))).toEqual(new Set([true, false]));
    for (const row of list) {
      const { family } = (await manager.get(`/api/families/${row.id}`)).body as { family: Family };
      expect(row.gateOk, family.code).toBe(family.gate.ok);
      expect(row.variantCount, family.code).toBe(family.variantCount);
    }
  });
});

describe('SKU format', () => {
  it('accepts every SKU the matrix writes and refuses others', () => {
    const cells = buildVariantMatrix({
      familyCode: 'MGB2',
      axes: [
        { kind: 'param', key: 'entryHoleDiameterMm', values: [27.5, 32] },
        { kind: 'param', key: 'perch', values: [true, false] },
        { kind: 'attribute', key: 'finish', values: ['uv-clear-coat', 'none'] },
      ],
      baseParams: {},
      materialId: 'pla',
    });
    for (const cell of cells) expect(SkuSchema.safeParse(cell.sku).success, cell.sku).toBe(true);
    for (const bad of ['HGB-28', 'FH-hgb-28', 'FH-H', 'FH-HGB-28 '])
      expect(SkuSchema.safeParse(bad).success).toBe(false);
  });
});
