/**
 * The review page names a variant's parameters with the template's labels and units, not code ("perch = false
 * trimStyle = shingles"). Checked against the gable box template's own parameter descriptions (our templates: no
 * outside source); the degree sign for angles follows the SI Brochure's table of non-SI units accepted for use
 * (BIPM, 2019), which writes the plane angle as "°".
 */
import { describe, expect, it } from 'vitest';
import { describeParameters, TEMPLATES } from '../templates/index';
import { describeVariantParams } from '../src/components/families/describeVariantParams';

const gable = TEMPLATES.find((template) => template.id === 'gable-box')!;
const parameters = describeParameters(gable);

describe('describeVariantParams()', () => {
  it('gives labels and units in the template order, booleans as yes/no and choices in words', () => {
    const lines = describeVariantParams(
      { trimStyle: 'shingles', perch: false, wallThicknessMm: 12.5, roofPitchDeg: 47, colour: 'moss' },
      parameters,
      { colour: 'Colour' },
    );
    const byKey = Object.fromEntries(lines.map((line) => [line.key, `${line.label}: ${line.value}`]));
    expect(byKey.perch).toBe('Perch under the entry: no');
    expect(byKey.trimStyle).toBe('Trim: shingles');
    expect(byKey.wallThicknessMm).toMatch(/: 12\.5 mm$/);
    expect(byKey.roofPitchDeg).toBe('Roof pitch: 47°');
    expect(byKey.colour).toBe('Colour: moss');
    // The template's order, attributes last; no code-style key is shown as a label.
    const order = parameters.map((p) => p.key).filter((key) => key in byKey);
    expect(lines.map((line) => line.key)).toEqual([...order, 'colour']);
    for (const line of lines) expect(line.label).not.toMatch(/[a-z][A-Z]|=/);
  });

  it('puts unknown keys in words when no label is given', () => {
    expect(describeVariantParams({ ventSlotCount: 3 }, [])).toEqual([
      { key: 'ventSlotCount', label: 'vent slot count', value: '3' },
    ]);
  });
});
