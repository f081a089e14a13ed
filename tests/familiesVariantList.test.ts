/**
 * Variant list of a family: filtering, sorting and paging run in the database. Every page the API answers is compared
 * with an independent reference computed here in plain TypeScript from the whole list (filter, stable sort with
 * missing figures last ascending and first descending, ties in matrix order, then slice): common practice, no source.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { and, eq, inArray } from 'drizzle-orm';
import type { FamilySummary } from '../shared/schemas/family';
import type { Variant, VariantSort } from '../shared/schemas/variant';
import { familyRevisions, familyVariants, families } from '../server/db/schema';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
let familyId = '';
let all: Variant[] = [];

beforeAll(async () => {
  const designer = await t.agent('designer');
  const list = (await designer.get('/api/families')).body.families as FamilySummary[];
  // The largest computed demo family.
  const computed = list.filter((f) => f.computeState === 'done').sort((a, b) => b.variantCount - a.variantCount);
  expect(computed.length).toBeGreaterThan(0);
  familyId = computed[0].id;
  // Clear the figures of every third variant so that missing values take part in the sort.
  const [family] = await t.ctx.db.select().from(families).where(eq(families.id, familyId));
  const [revision] = await t.ctx.db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, familyId), eq(familyRevisions.number, family.currentRevision)));
  const rows = await t.ctx.db.select().from(familyVariants).where(eq(familyVariants.revisionId, revision.id));
  const cleared = rows.filter((row) => row.index % 3 === 1).map((row) => row.id);
  if (cleared.length > 0) {
    await t.ctx.db
      .update(familyVariants)
      .set({ verdict: null, cost: null, report: null, status: 'pending' })
      .where(inArray(familyVariants.id, cleared));
  }
  const res = await designer.get(`/api/families/${familyId}/variants?pageSize=500`);
  expect(res.status).toBe(200);
  all = res.body.variants;
  expect(all.length).toBeGreaterThan(3);
});

afterAll(async () => {
  await familyJobs(t.ctx).close();
});

const VERDICT_RANK = { fail: 0, warn: 1, pass: 2 } as const;

/** The reference: the list as a person would sort it by hand. */
function reference(
  variants: Variant[],
  sort: VariantSort,
  dir: 'asc' | 'desc',
  verdict?: string,
  q?: string,
): Variant[] {
  const key = (v: Variant): number | string | null => {
    if (sort === 'sku') return v.sku;
    if (sort === 'verdict') return v.verdict ? VERDICT_RANK[v.verdict] : 3;
    if (sort === 'costCents') return v.cost?.costCents ?? null;
    if (sort === 'supportVolumeMm3') return v.report?.supportVolumeMm3 ?? null;
    if (sort === 'printTimeMin') return v.report?.printTimeMin ?? null;
    return v.index;
  };
  const sign = dir === 'desc' ? -1 : 1;
  return variants
    .filter((v) => (!verdict || v.verdict === verdict) && (!q || v.sku.toLowerCase().includes(q.toLowerCase())))
    .sort((a, b) => {
      const ka = key(a);
      const kb = key(b);
      if (ka === null || kb === null) {
        // Missing figures count as larger than any value.
        if (ka !== kb) return sign * (ka === null ? 1 : -1);
        return sign * (a.index - b.index);
      }
      return sign * (ka < kb ? -1 : ka > kb ? 1 : a.index - b.index);
    });
}

describe('variant list in SQL', () => {
  const sorts: VariantSort[] = ['index', 'sku', 'verdict', 'costCents', 'supportVolumeMm3', 'printTimeMin'];

  it('sorts every column both ways, ties in matrix order, missing figures at the end ascending', async () => {
    const designer = await t.agent('designer');
    for (const sort of sorts) {
      for (const dir of ['asc', 'desc'] as const) {
        const res = await designer.get(`/api/families/${familyId}/variants?sort=${sort}&dir=${dir}&pageSize=500`);
        expect(res.status).toBe(200);
        expect(
          res.body.variants.map((v: Variant) => v.sku),
          `${sort} ${dir}`,
        ).toEqual(reference(all, sort, dir).map((v) => v.sku));
        expect(res.body.total).toBe(all.length);
      }
    }
  });

  it('pages: each page is the matching slice and the total counts every match', async () => {
    const designer = await t.agent('designer');
    const pageSize = 3;
    const expected = reference(all, 'costCents', 'desc');
    const pages = Math.ceil(expected.length / pageSize) + 1;
    for (let page = 1; page <= pages; page++) {
      const res = await designer.get(
        `/api/families/${familyId}/variants?sort=costCents&dir=desc&page=${page}&pageSize=${pageSize}`,
      );
      expect(res.body.total).toBe(expected.length);
      expect(res.body.page).toBe(page);
      expect(res.body.variants.map((v: Variant) => v.sku)).toEqual(
        expected.slice((page - 1) * pageSize, page * pageSize).map((v) => v.sku),
      );
    }
  });

  it('filters by verdict and by part of the SKU in any case, and counts only the matches', async () => {
    const designer = await t.agent('designer');
    const verdicts = [...new Set(all.map((v) => v.verdict).filter((v): v is NonNullable<typeof v> => v !== null))];
    expect(verdicts.length).toBeGreaterThan(0);
    for (const verdict of verdicts) {
      const res = await designer.get(`/api/families/${familyId}/variants?verdict=${verdict}&sort=sku&pageSize=2`);
      const expected = reference(all, 'sku', 'asc', verdict);
      expect(res.body.total).toBe(expected.length);
      expect(res.body.variants.map((v: Variant) => v.sku)).toEqual(expected.slice(0, 2).map((v) => v.sku));
    }
    // A piece of a real SKU in lower case, and characters that are wildcards in SQL LIKE.
    const piece = all[all.length - 1].sku.split('-').slice(-2).join('-').toLowerCase();
    for (const q of [piece, '%', '_']) {
      const res = await designer.get(`/api/families/${familyId}/variants?q=${encodeURIComponent(q)}&pageSize=500`);
      const expected = reference(all, 'index', 'asc', undefined, q);
      expect(res.body.total, q).toBe(expected.length);
      expect(res.body.variants.map((v: Variant) => v.sku)).toEqual(expected.map((v) => v.sku));
    }
    expect(reference(all, 'index', 'asc', undefined, piece).length).toBeGreaterThan(0);
  });
});
