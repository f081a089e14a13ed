/**
 * Reuse of sub-solids (the editor worker's cache): for every template and every parameter, moving that one
 * parameter from the defaults gives the same mesh hash with a warm cache as a cold build, at full quality and as a
 * draft, so a sub-solid that forgot to declare a parameter it depends on is caught. A move of the entry hole reuses
 * the shell (the cache answers). Expected behaviour is our own design (a cache never changes a result), no outside
 * source; the hash is sha256 over the canonical mesh bytes. A drag's drafts never evict the full sub-solids.
 */
import { describe, expect, it } from 'vitest';
import { TEMPLATES, describeParameters, generate, generateDraft, liveLimits, SolidCache } from '../templates/index';
import type { AnyTemplate, ParameterDescription } from '../templates/index';
import { meshHash } from '../shared/mesh/meshHash';

/** A value one step (or a few) away from the default, inside the range the other defaults allow. */
function moved(template: AnyTemplate, p: ParameterDescription): number | boolean | string {
  if (p.kind === 'boolean') return !p.default;
  if (p.kind === 'choice') return (p.options ?? []).find((o) => o !== p.default) ?? p.default;
  const live = liveLimits(template, {})[p.key] ?? { min: p.min ?? 0, max: p.max ?? 0 };
  const step = Math.max(p.step ?? 1, ((live.max - live.min) / 10) | 0);
  const up = (p.default as number) + step;
  return up <= live.max ? up : (p.default as number) - step;
}

describe.each(TEMPLATES.map((t) => [t.id, t] as const))('%s with a sub-solid cache', (_id, template) => {
  it('gives the same mesh as a cold build after any one parameter moves, full and draft', async () => {
    const cache = new SolidCache();
    await generate(template.id, {}, { cache });
    await generateDraft(template.id, {}, { cache });
    for (const p of describeParameters(template)) {
      const params = { [p.key]: moved(template, p) };
      const warm = await generate(template.id, params, { cache });
      const cold = await generate(template.id, params);
      expect(warm.sha256, `${p.key} → ${String(params[p.key])}`).toBe(cold.sha256);
      const warmDraft = await generateDraft(template.id, params, { cache });
      const coldDraft = await generateDraft(template.id, params);
      expect(await meshHash(warmDraft.mesh), `draft ${p.key}`).toBe(await meshHash(coldDraft.mesh));
    }
    cache.clear();
  }, 120_000);

  it('reuses the shell when only the entry hole moves', async () => {
    const cache = new SolidCache();
    const first = await generate(template.id, { entryHoleDiameterMm: 30 }, { cache });
    const before = { ...cache.counts };
    const second = await generate(template.id, { entryHoleDiameterMm: 31 }, { cache });
    expect(cache.counts.hits).toBeGreaterThan(before.hits);
    expect(cache.counts.misses).toBe(before.misses);
    expect(second.sha256).not.toBe(first.sha256);
    expect(second.sha256).toBe((await generate(template.id, { entryHoleDiameterMm: 31 })).sha256);
    cache.clear();
  }, 60_000);

  it('keeps the full sub-solids while a drag fills the cache with drafts', async () => {
    const cache = new SolidCache();
    await generate(template.id, {}, { cache });
    // A drag on the wall slider: 13 drafts, each with new sub-solids, more than the draft pool holds.
    for (let wallMm = 4; wallMm <= 10; wallMm += 0.5)
      await generateDraft(template.id, { wallThicknessMm: wallMm }, { cache });
    const before = { ...cache.counts };
    await generate(template.id, {}, { cache });
    expect(cache.counts.misses).toBe(before.misses);
    expect(cache.counts.hits).toBeGreaterThan(before.hits);
    cache.clear();
  }, 60_000);
});
