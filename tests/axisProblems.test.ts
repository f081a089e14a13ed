/**
 * The family editor's axis checks against the real template parameter descriptions: values outside the template's
 * own range, of the wrong kind, not among a choice's options, listed twice, an empty axis, an unknown key, and
 * attribute ids that are not lower-case ids. The ranges come from the template's zod schema (templates/gableBox.ts);
 * the server checks the same again (tests/families.test.ts). Messages are our own wording, no outside source.
 */
import { describe, expect, it } from 'vitest';
import { describeParameters, findTemplate } from '../templates/index';
import { axisProblems, valueProblems } from '../src/components/families/axisProblems';

const parameters = describeParameters(findTemplate('gable-box')!);
const entry = parameters.find((param) => param.key === 'entryHoleDiameterMm')!;
const choice = parameters.find((param) => param.kind === 'choice');
const flag = parameters.find((param) => param.kind === 'boolean');

describe('axisProblems', () => {
  it('accepts values inside the range, including both ends', () => {
    // source: RSPB — 25 mm blue tit, 28 mm great tit, 32 mm house sparrow
    expect(axisProblems({ kind: 'param', key: entry.key, values: [25, 28, 32] }, parameters)).toEqual([]);
    expect(axisProblems({ kind: 'param', key: entry.key, values: [entry.min!, entry.max!] }, parameters)).toEqual([]);
  });

  it('names a value just outside either end of the range, with the limit', () => {
    const below = axisProblems({ kind: 'param', key: entry.key, values: [entry.min! - 0.5] }, parameters);
    expect(below).toHaveLength(1);
    expect(below[0]).toContain(`(${entry.min} mm)`);
    const above = axisProblems({ kind: 'param', key: entry.key, values: [entry.max! + 0.5] }, parameters);
    expect(above[0]).toMatch(/above the highest/);
    expect(above[0]).toContain(`(${entry.max} mm)`);
  });

  it('refuses an empty axis, duplicates and an unknown key', () => {
    expect(axisProblems({ kind: 'param', key: entry.key, values: [] }, parameters)).toEqual([
      'Add at least one value.',
    ]);
    expect(axisProblems({ kind: 'param', key: entry.key, values: [28, 28] }, parameters)).toEqual([
      '28 is listed twice.',
    ]);
    expect(axisProblems({ kind: 'param', key: 'chimneyHeightMm', values: [10] }, parameters)[0]).toMatch(
      /no parameter/,
    );
  });

  it('checks the kind of value a parameter takes', () => {
    expect(valueProblems('28', entry)[0]).toMatch(/not a number/);
    // The gable box has a choice (trim style) and yes/no parameters; both kinds are checked.
    expect(choice && flag).toBeTruthy();
    expect(valueProblems(choice!.options![0], choice!)).toEqual([]);
    expect(valueProblems('gilded', choice!)[0]).toMatch(/not one of/);
    expect(valueProblems(true, flag!)).toEqual([]);
    expect(valueProblems(1, flag!)[0]).toMatch(/not yes or no/);
  });

  it('wants attribute values as lower-case ids', () => {
    expect(axisProblems({ kind: 'attribute', key: 'finish', values: ['uv-clear-coat', 'none'] }, parameters)).toEqual(
      [],
    );
    const bad = axisProblems({ kind: 'attribute', key: 'colour', values: ['Moss Green'] }, parameters);
    expect(bad[0]).toMatch(/lower-case id/);
  });
});
