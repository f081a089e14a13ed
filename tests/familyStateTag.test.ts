/**
 * State tags: every family state has its own colour pair and its own shape, and none uses the warning tone (ochre)
 * that marks cautions and unsaved work. Read from the component's source (common practice, no source).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FAMILY_STATES } from '../shared/schemas/familySpec';

const source = readFileSync(new URL('../src/components/families/FamilyStateTag.vue', import.meta.url), 'utf8');

function ruleOf(state: string): string {
  const match = new RegExp(`\\.state-tag--${state} \\{([^}]*)\\}`).exec(source);
  return match?.[1].replace(/\s+/g, ' ').trim() ?? '';
}

describe('FamilyStateTag', () => {
  it('gives each state its own background and text colour, none in the warning tone', () => {
    const rules = FAMILY_STATES.map((state) => ruleOf(state));
    for (const [i, rule] of rules.entries()) {
      expect(rule, FAMILY_STATES[i]).toMatch(/background: [^;]+;/);
      expect(rule, FAMILY_STATES[i]).toMatch(/color: [^;]+;/);
      expect(rule).not.toMatch(/ochre|warning/);
    }
    const pairs = rules.map((rule) => `${/background: ([^;]+);/.exec(rule)?.[1]}|${/color: ([^;]+);/.exec(rule)?.[1]}`);
    expect(new Set(pairs).size).toBe(FAMILY_STATES.length);
  });

  it('draws a shape for each state', () => {
    const branches = [...source.matchAll(/state === '([a-z_]+)'/g)].map((m) => m[1]);
    // Every state but the last has its own branch; the last takes the v-else.
    expect(new Set(branches).size).toBe(FAMILY_STATES.length - 1);
    expect(source).not.toContain('type="warning"');
  });
});
