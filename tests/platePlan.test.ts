/**
 * The plate rule: the parts of one unit go on one plate when a complete set fits, otherwise each part on plates of
 * its own; plate counts, farm capacity and quotes follow it. Check values are worked out by hand (grid packing
 * n = floor((B + s) / (f + s)) per axis with a 10 mm gap: common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { describePlatePlan, fitPartSizes, platesForUnits } from '../shared/analysis/fitParts';
import { estimateFarmCapacity } from '../shared/production/estimateFarmCapacity';

const PLATE_256: [number, number, number] = [256, 256, 256];

describe('unit plate plan', () => {
  it('puts a box and a plug that cannot share a plate on plates of their own, with a plate count per unit', () => {
    // body 182 × 165 needs a 192 × 175 cell; the plug's 110 × 110 cell fits beside it neither in x (192 + 110 > 266)
    // nor in y (175 + 110 > 266), so the set needs two plates: 1 body a plate, 2 × 2 = 4 plugs a plate.
    const fit = fitPartSizes(
      [
        [182, 165, 239],
        [100, 100, 12],
      ],
      PLATE_256,
    );
    expect(fit.fits).toBe(true);
    expect(fit.setsPerPlate).toBe(0);
    expect(fit.plan.layout).toBe('separate');
    expect(fit.plan.platesPerUnit).toBe(2);
    expect(fit.plan.groups.map((g) => g.unitsPerPlate)).toEqual([1, 4]);
    // 43 units: 43 body plates + ceil(43 / 4) = 11 plug plates, never "43 plates of 1".
    expect(platesForUnits(fit.plan, 43)).toBe(54);
    expect(describePlatePlan(fit.plan, ['body', 'floor-plug'])).toBe(
      '2 plates per unit: body 1 per plate, floor plug 4 per plate',
    );
  });

  it('keeps the parts together when a set fits, with the number of sets a plate holds', () => {
    // cells 90 × 90 and 50 × 50 (with the gap) on a 266 × 266 plate, packed in shelves.
    const fit = fitPartSizes(
      [
        [80, 80, 100],
        [40, 40, 10],
      ],
      PLATE_256,
    );
    expect(fit.plan.layout).toBe('together');
    expect(fit.plan.platesPerUnit).toBe(1);
    expect(fit.plan.groups).toHaveLength(1);
    expect(fit.plan.groups[0].partIndexes).toEqual([0, 1]);
    expect(fit.plan.groups[0].unitsPerPlate).toBe(fit.setsPerPlate);
    // Area bound: (266 × 266) / (90² + 50²) = 6.67, so at most 6 sets; at least the 2 × 2 grid of bodies with plugs
    // on a shelf of their own: 4.
    expect(fit.setsPerPlate).toBeGreaterThanOrEqual(4);
    expect(fit.setsPerPlate).toBeLessThanOrEqual(6);
    expect(platesForUnits(fit.plan, 10)).toBe(Math.ceil(10 / fit.setsPerPlate));
  });

  it('says when a part does not fit the printer at all', () => {
    const fit = fitPartSizes([[300, 100, 100]], PLATE_256);
    expect(fit.plan.layout).toBe('none');
    expect(fit.plan.platesPerUnit).toBe(0);
    expect(describePlatePlan(fit.plan)).toBe('does not fit this printer');
  });
});

describe('farm capacity under the plate rule', () => {
  it('counts the plates of each group and the time of the busiest printer', () => {
    // 43 units, no failures, 2 printers, 24 h a day, plate change 10 min:
    // body group: 43 plates of 1 × 300 min (+10) = 310 min each; plug group: ceil(43 / 4) = 11 plates of 4 × 20 min
    // (+10) = 90 min. Per printer: ceil(43 / 2) = 22 body plates + ceil(11 / 2) = 6 plug plates
    // = 22 × 310 + 6 × 90 = 7360 min = 5.11 days -> 6 days + 1 handling day.
    const c = estimateFarmCapacity({
      unitsWanted: 43,
      printers: 2,
      hoursPerDay: 24,
      copiesPerPlate: 1,
      printTimeMin: 320,
      failureRatePct: 0,
      plateChangeMin: 10,
      handlingDays: 1,
      plateGroups: [
        { unitsPerPlate: 1, printTimeMin: 300 },
        { unitsPerPlate: 4, printTimeMin: 20 },
      ],
    });
    expect(c.plates).toBe(54);
    expect(c.groups.map((g) => g.plates)).toEqual([43, 11]);
    expect(c.platesPerPrinter).toBe(28);
    expect(c.printDays).toBeCloseTo(7360 / 1440, 9);
    expect(c.leadTimeDays).toBe(7);
    expect(c.expectedGoodUnits).toBe(43);
  });

  it('gives the same figures as before for one group', () => {
    const one = estimateFarmCapacity({
      unitsWanted: 16,
      printers: 2,
      hoursPerDay: 24,
      copiesPerPlate: 4,
      printTimeMin: 60,
      failureRatePct: 0,
      plateChangeMin: 0,
      handlingDays: 1,
    });
    // analytic: 16 / 4 = 4 plates, 2 per printer, 2 × 240 min = 1/3 day -> 1 + 1 days
    expect(one.plates).toBe(4);
    expect(one.printDays).toBeCloseTo(1 / 3, 9);
    expect(one.leadTimeDays).toBe(2);
  });
});
