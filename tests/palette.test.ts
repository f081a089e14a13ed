/**
 * The palette is the one place colours are named: no `.vue` file writes a hex colour, and the CSS variables and
 * three.js numbers come from it. A rule of this code base (common practice, no outside source).
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { applyPaletteVariables, PALETTE, paletteNumber, paletteVariable } from '../src/styles/palette';

function vueFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return vueFiles(path);
    return name.endsWith('.vue') ? [path] : [];
  });
}

describe('palette', () => {
  it('leaves no hex colour in a .vue file', () => {
    const offenders = vueFiles('src').flatMap((file) =>
      readFileSync(file, 'utf8')
        .split('\n')
        .map((line, i) => ({ file, line: i + 1, text: line.replace(/href="#[\w-]+"/g, '') }))
        .filter(({ text }) => /#[0-9a-fA-F]{6}\b|#[0-9a-fA-F]{3}\b/.test(text))
        .map(({ file: f, line }) => `${f}:${line}`),
    );
    expect(offenders).toEqual([]);
  });

  it('gives three.js the number of a palette colour and stylesheets a variable for each', () => {
    expect(PALETTE.moss).toBe('#3f6a3a');
    expect(paletteNumber('moss')).toBe(0x3f6a3a);
    expect(paletteVariable('mossDark')).toBe('--nw-moss-dark');
    const set = new Map<string, string>();
    applyPaletteVariables({ style: { setProperty: (name, value) => set.set(name, value) } });
    expect(set.get('--nw-ink-soft')).toBe(PALETTE.inkSoft);
    expect(set.size).toBe(Object.keys(PALETTE).length);
  });
});
