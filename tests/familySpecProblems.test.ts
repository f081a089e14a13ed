/**
 * The shared family spec check returns every problem with its field, in the order the server reports them; the
 * editor's template view (from the template summary) and the server's (from the template schema) agree on range
 * problems. Family rules are our own product decisions: common practice, no source.
 */
import { describe, expect, it } from 'vitest';
import { familySpecProblems, type SpecToCheck } from '../shared/families/familySpecProblems';
import { DEFAULT_MATERIALS, DEFAULT_PRINTERS } from '../shared/production/defaults';
import { describeParameters, findTemplate } from '../templates/index';
import { specTemplateOf } from '../server/services/familySpecCheck';
import { summarySpecTemplate } from '../src/components/families/summarySpecTemplate';

const printers = new Map(DEFAULT_PRINTERS.map((p) => [p.id, p]));
const materials = new Map(DEFAULT_MATERIALS.map((m) => [m.id, m]));
const gable = findTemplate('gable-box')!;
const parameters = describeParameters(gable);
const summary = {
  id: gable.id,
  version: gable.version,
  name: gable.name,
  summary: gable.summary,
  parameters,
  defaults: Object.fromEntries(parameters.map((p) => [p.key, p.default])),
};

function spec(overrides: Partial<SpecToCheck> = {}): SpecToCheck {
  return {
    templateId: 'gable-box',
    baseParams: {},
    axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [28, 32] }],
    printerId: DEFAULT_PRINTERS[0].id,
    materialId: 'pla',
    ...overrides,
  };
}

describe('family spec problems', () => {
  it('finds nothing wrong with a sound spec, on either template view', () => {
    for (const template of [specTemplateOf('gable-box'), summarySpecTemplate(summary)]) {
      const check = familySpecProblems(spec(), template, printers, materials);
      expect(check.problems).toEqual([]);
      expect(check.templateVersion).toBe(gable.version);
    }
  });

  it('lists every problem with its field, printer first as the server reports it', () => {
    const check = familySpecProblems(
      spec({
        printerId: 'no-such-printer',
        axes: [
          { kind: 'param', key: 'entryHoleDiameterMm', values: [28, 999] },
          { kind: 'attribute', key: 'colour', values: ['white', 'plaid'] },
        ],
      }),
      specTemplateOf('gable-box'),
      printers,
      materials,
    );
    expect(check.problems.map((p) => p.path)).toEqual(['printerId', 'axes.0.values.1', 'axes.1.values.1']);
    expect(check.problems[0].message).toContain('no-such-printer');
    expect(check.problems[2].message).toContain('plaid');
  });

  it('flags the same out-of-range value from the template summary as from the template', () => {
    const bad = spec({ axes: [{ kind: 'param', key: 'entryHoleDiameterMm', values: [999] }] });
    const server = familySpecProblems(bad, specTemplateOf('gable-box'), printers, materials).problems;
    const editor = familySpecProblems(bad, summarySpecTemplate(summary), printers, materials).problems;
    expect(server.map((p) => p.path)).toEqual(['axes.0.values.0']);
    expect(editor.map((p) => p.path)).toEqual(['axes.0.values.0']);
  });

  it('names an unknown template and pins nothing', () => {
    const check = familySpecProblems(spec({ templateId: 'dovecote' }), undefined, printers, materials);
    expect(check.problems).toEqual([{ path: 'templateId', message: 'unknown template "dovecote"' }]);
    expect(check.templateVersion).toBeNull();
  });
});
