/**
 * The spec sheet's sun-heat figures come from the outdoor assessment stored with the variant when there is one (the
 * figures the family gate judged), and are assessed from the material and colour only for older variants.
 * Expected values: the ASHRAE sol-air formula (ASHRAE Handbook—Fundamentals); PLA's heat-deflection temperature (NatureWorks Ingeo 2003D data sheet).
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_MATERIALS } from '../shared/production/defaults';
import { assessOutdoor } from '../shared/thermal/assessOutdoor';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';
import { specSheetInput } from '../server/services/specSheet';
import { catalogueVariantFixture } from './salesFixtures';

const pla = DEFAULT_MATERIALS.find((m) => m.id === 'pla')!;
/** The seed materials, as a new database holds them, and a studio name. */
const documents = { materials: new Map(DEFAULT_MATERIALS.map((m) => [m.id, m])), studioName: 'Fernhollow Studio' };

describe('spec sheet sun heat', () => {
  it('prefers the stored outdoor assessment and falls back to assessing the colour', async () => {
    const variant = await catalogueVariantFixture({ sku: 'FH-TSG-28-SAND', templateId: 'gable-box', colour: 'sand' });
    const fresh = await specSheetInput(variant, { settings: DEFAULT_SALES_SETTINGS, ...documents });
    // source: ASHRAE sol-air formula, sand α 0.40 (estimate in shared/production/defaults.ts), 30 °C air:
    // roof 30 + 0.40·1000/17 − 3.9 = 49.6 °C, wall 30 + 0.40·600/17 = 44.1 °C; PLA HDT 55 °C (NatureWorks Ingeo 2003D data sheet)
    expect(fresh.outdoor?.roofC).toBeCloseTo(30 + 400 / 17 - 3.9, 6);
    expect(fresh.outdoor?.wallC).toBeCloseTo(30 + 240 / 17, 6);
    expect(fresh.outdoor?.heatDeflectionC).toBe(55);

    // A variant computed with its outdoor assessment stored (here for a 35 °C day) shows those figures.
    const stored = assessOutdoor({ material: pla, colourId: 'sand', airC: 35 });
    const withStored = await specSheetInput(
      { ...variant, report: { ...variant.report, outdoor: stored } },
      { settings: DEFAULT_SALES_SETTINGS, ...documents },
    );
    // source: ASHRAE sol-air formula at 35 °C air: roof 35 + 0.40·1000/17 − 3.9 = 54.6 °C
    expect(withStored.outdoor?.airC).toBe(35);
    expect(withStored.outdoor?.roofC).toBeCloseTo(35 + 400 / 17 - 3.9, 6);
    const heat = withStored.cautions.find((c) => c.title === 'Heat')!;
    expect(heat.text).toContain('In full sun on a 35 °C day');
    expect(heat.text).toMatch(/follow local advice/);
  }, 60_000);
});
