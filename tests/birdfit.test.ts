import { describe, expect, it } from 'vitest';
import { assessBirdFit } from '../shared/birdfit/assessBirdFit';
import { SPECIES } from '../shared/birdfit/species';
import { SpeciesSchema } from '../shared/schemas/birdfit';
import type { NestBoxFacts } from '../shared/schemas/nestbox';

const row = (id: string) => SPECIES.find((s) => s.id === id)!;

/** A well-made box (no perch, drained, vented, opening side, ¾ in walls) to vary one feature at a time. */
const good: NestBoxFacts = {
  entryHoleDiameterMm: 38.1,
  floorWidthMm: 127,
  floorDepthMm: 127,
  cavityDepthMm: 203,
  holeAboveFloorMm: 152,
  wallThicknessMm: 19,
  hasPerch: false,
  drainageHoleCount: 4,
  ventilationAreaMm2: 600,
  cleaningAccess: true,
  chambers: 1,
};
const codes = (facts: NestBoxFacts, region?: 'north-america' | 'europe') =>
  assessBirdFit(facts, { region }).warnings.map((w) => w.code);

describe('species table', () => {
  it('has at least 12 valid rows in North America and Europe, each with a source', () => {
    expect(SPECIES.length).toBeGreaterThanOrEqual(12);
    expect(SPECIES.some((s) => s.region === 'north-america')).toBe(true);
    expect(SPECIES.some((s) => s.region === 'europe')).toBe(true);
    for (const s of SPECIES) {
      expect(() => SpeciesSchema.parse(s)).not.toThrow();
      expect(s.source.length).toBeGreaterThan(10);
      for (const r of [s.holeDiameterMm, s.floorMm, s.cavityDepthMm, s.holeAboveFloorMm, s.mountingHeightM]) {
        expect(r.min).toBeLessThanOrEqual(r.max);
      }
    }
    expect(new Set(SPECIES.map((s) => s.id)).size).toBe(SPECIES.length);
  });

  it('carries the published North American values', () => {
    // source: Bureau of Biological Survey table (bfnc.ca), inches converted at 25.4 mm
    expect(row('eastern-bluebird').holeDiameterMm.min).toBeCloseTo(38.1, 1);
    expect(row('eastern-bluebird').floorMm.max).toBeCloseTo(127, 0);
    expect(row('eastern-bluebird').holeAboveFloorMm.min).toBeCloseTo(152.4, 1);
    expect(row('eastern-bluebird').mountingHeightM.min).toBeCloseTo(1.5, 1);
    expect(row('black-capped-chickadee').holeDiameterMm.min).toBeCloseTo(28.6, 1);
    expect(row('northern-flicker').holeDiameterMm.min).toBeCloseTo(63.5, 1);
    expect(row('american-kestrel').floorMm.min).toBeCloseTo(203.2, 1);
    // source: Bureau of Biological Survey table vs TWRA tree swallow page — 1½ in (classic) vs 1¼ in: the range keeps both
    expect(row('tree-swallow').holeDiameterMm.min).toBeCloseTo(31.8, 1);
    expect(row('tree-swallow').holeDiameterMm.max).toBeCloseTo(38.1, 1);
  });

  it('carries the published European hole sizes', () => {
    // source: RSPB — blue tit 25, great tit 28, house sparrow 32, starling 45 mm
    expect(row('blue-tit').holeDiameterMm.min).toBe(25);
    expect(row('great-tit').holeDiameterMm.min).toBe(28);
    expect(row('house-sparrow').holeDiameterMm.min).toBe(32);
    expect(row('common-starling').holeDiameterMm.min).toBe(45);
    // source: NABU and BUND — blue tit up to 28, great tit up to 32 mm
    expect(row('blue-tit').holeDiameterMm.max).toBe(28);
    expect(row('great-tit').holeDiameterMm.max).toBe(32);
    // source: RSPB — hole ≥ 125 mm above the floor; mounting 2–4 m
    expect(row('blue-tit').holeAboveFloorMm.min).toBe(125);
    expect(row('blue-tit').mountingHeightM).toEqual({ min: 2, max: 4 });
  });

  it('suits each species with a box built to its own row (consistency)', () => {
    for (const s of SPECIES) {
      const box: NestBoxFacts = {
        ...good,
        entryHoleDiameterMm: s.holeDiameterMm.min,
        entryHoleHeightMm: s.holeHeightMm?.min,
        floorWidthMm: s.floorMm.min,
        floorDepthMm: s.floorMm.min,
        cavityDepthMm: s.cavityDepthMm.min,
        holeAboveFloorMm: s.holeAboveFloorMm.min,
      };
      const fit = assessBirdFit(box).species.find((f) => f.speciesId === s.id)!;
      expect(fit.reasons, s.id).toEqual([]);
    }
  });
});

describe('assessBirdFit', () => {
  it('suits Eastern Bluebird with a 38.1 mm hole and no starling warning', () => {
    // source: NABS/TWRA and the classic table — Eastern Bluebird 1½ in (38.1 mm)
    const r = assessBirdFit(good, { region: 'north-america' });
    expect(r.suits.map((s) => s.speciesId)).toContain('eastern-bluebird');
    // source: Bureau of Biological Survey table (E. Dearborn, Bird Houses and How to Build Them, USDA, 1914/1923) — "a 1½ in hole keeps starlings out"
    expect(r.warnings.map((w) => w.code)).not.toContain('admits-starlings');
    expect(r.suits.map((s) => s.speciesId)).not.toContain('european-starling-na');
  });

  it('suits blue tits with a 25 mm hole but not great tits, and says why', () => {
    // source: RSPB — blue tit 25 mm, great tit 28 mm, hole ≥ 125 mm above the floor
    const box = {
      ...good,
      entryHoleDiameterMm: 25,
      floorWidthMm: 120,
      floorDepthMm: 120,
      cavityDepthMm: 160,
      holeAboveFloorMm: 125,
    };
    const r = assessBirdFit(box, { region: 'europe' });
    const ids = r.suits.map((s) => s.speciesId);
    expect(ids).toContain('blue-tit');
    expect(ids).toContain('coal-tit');
    expect(ids).not.toContain('great-tit');
    const great = r.species.find((s) => s.speciesId === 'great-tit')!;
    expect(great.suits).toBe(false);
    expect(great.reasons.join(' ')).toMatch(/entry 25 mm/);
  });

  it('gives the reasons for a shallow box', () => {
    // source: Bureau of Biological Survey — Northern Flicker 16–18 in deep, hole 14–16 in up
    const r = assessBirdFit({ ...good, entryHoleDiameterMm: 63.5 }, { region: 'north-america' });
    const flicker = r.species.find((s) => s.speciesId === 'northern-flicker')!;
    expect(flicker.suits).toBe(false);
    expect(flicker.reasons.join(' ')).toMatch(/cavity 203 mm deep/);
    expect(flicker.reasons.join(' ')).toMatch(/above the floor/);
  });

  it('warns against a perch', () => {
    // source: USFWS "For the Birds" (2001) — never put a perch under the hole
    const r = assessBirdFit({ ...good, hasPerch: true });
    const w = r.warnings.find((x) => x.code === 'perch')!;
    expect(w.severity).toBe('warning');
    expect(w.source).toMatch(/USFWS/);
    expect(codes(good)).not.toContain('perch');
  });

  it('warns that a hole over 1½ in admits starlings in North America only', () => {
    // source: Bureau of Biological Survey table (E. Dearborn, Bird Houses and How to Build Them, USDA, 1914/1923) — starling box 2 in hole; a 1½ in hole keeps starlings out
    expect(codes({ ...good, entryHoleDiameterMm: 40 }, 'north-america')).toContain('admits-starlings');
    expect(codes({ ...good, entryHoleDiameterMm: 40 }, 'europe')).not.toContain('admits-starlings');
    // the starling row itself suits a 2 in hole box built to its size
    const starlingBox = {
      ...good,
      entryHoleDiameterMm: 50.8,
      floorWidthMm: 152,
      floorDepthMm: 152,
      cavityDepthMm: 410,
      holeAboveFloorMm: 360,
    };
    expect(assessBirdFit(starlingBox).species.find((s) => s.speciesId === 'european-starling-na')!.suits).toBe(true);
    expect(assessBirdFit(starlingBox).suits.map((s) => s.speciesId)).not.toContain('european-starling-na');
  });

  it('notes house sparrows from 32 mm, as a caution in North America and information in Europe', () => {
    // source: RSPB and NABU — house sparrow 32 mm
    const r = assessBirdFit({ ...good, entryHoleDiameterMm: 32 });
    const w = r.warnings.filter((x) => x.code === 'admits-house-sparrows');
    expect(w.find((x) => x.region === 'north-america')!.severity).toBe('caution');
    expect(w.find((x) => x.region === 'europe')!.severity).toBe('info');
    // 28.6 mm (chickadee) keeps them out: RSPB uses 28 mm for great and tree sparrow boxes
    expect(codes({ ...good, entryHoleDiameterMm: 28.6 })).not.toContain('admits-house-sparrows');
  });

  it('warns about missing drainage, ventilation and cleaning access', () => {
    // source: RSPB/BTO/NABU/USFWS drainage; Cornell ventilation and cleaning access (RSPB nest-box advice; BTO essential guide; NABU; USFWS For the Birds, 2001; Cornell NestWatch)
    const c = codes({ ...good, drainageHoleCount: 0, ventilationAreaMm2: 0, cleaningAccess: false });
    expect(c).toEqual(expect.arrayContaining(['no-drainage', 'no-ventilation', 'no-cleaning-access']));
    const ok = codes(good);
    for (const code of ['no-drainage', 'no-ventilation', 'no-cleaning-access']) expect(ok).not.toContain(code);
  });

  it('cautions when the hole is under 125 mm above the floor', () => {
    // source: RSPB — bottom of hole ≥ 125 mm above the inside floor
    expect(codes({ ...good, holeAboveFloorMm: 100 })).toContain('hole-low-above-floor');
    expect(codes({ ...good, holeAboveFloorMm: 125 })).not.toContain('hole-low-above-floor');
  });

  it('flags an entry that does not fit below the roof', () => {
    // analytic: hole height above floor + hole must be under the cavity depth
    expect(codes({ ...good, cavityDepthMm: 170 })).toContain('hole-too-high-for-cavity');
  });

  it('explains thin printed walls against wood guidance', () => {
    // source: BTO and Which? (≥ 15 mm); Cornell NestWatch (¾ in)
    const r = assessBirdFit({ ...good, wallThicknessMm: 3 });
    const w = r.warnings.find((x) => x.code === 'thin-walls')!;
    expect(w.severity).toBe('warning');
    expect(w.message).toMatch(/PLA/);
    // source: computed from k (USDA FPL Wood Handbook Table 4-7; MakeItFrom PLA data sheet) — 3 mm PLA (k 0.13) = 0.023 m²K/W vs 19 mm pine (k 0.11) = 0.173: about 13 %
    expect(w.message).toMatch(/about 13 %/);
    expect(
      assessBirdFit({ ...good, wallThicknessMm: 16 }).warnings.find((x) => x.code === 'thin-walls')!.severity,
    ).toBe('caution');
    expect(codes(good)).not.toContain('thin-walls');
  });

  it('always shows mounting, predator and heat guidance with sources', () => {
    const r = assessBirdFit(good);
    for (const code of ['mounting-height', 'predator-guard', 'plastic-heat']) {
      const w = r.warnings.find((x) => x.code === code)!;
      expect(w.source.length).toBeGreaterThan(3);
    }
    expect(r.warnings.find((x) => x.code === 'mounting-height')!.message).toMatch(/Eastern Bluebird 1\.52–3\.05 m/);
  });

  it('rejects a box without valid facts', () => {
    expect(() => assessBirdFit({ ...good, entryHoleDiameterMm: -3 })).toThrow();
  });
});
