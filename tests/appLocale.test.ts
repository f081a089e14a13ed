/**
 * Empty fields never show the UI library's stock placeholders ("Please Input", "Please Select"): the staff screens use
 * our own locale, where an empty input shows nothing unless the screen gives a meaningful example, and an empty choice
 * asks to choose. House wording rule (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { appLocale } from '../src/styles/locale';

/** Every text of the locale, with where it is. */
function texts(node: unknown, path: string, out: Array<[string, string]>): Array<[string, string]> {
  if (typeof node === 'string') out.push([path, node]);
  else if (node && typeof node === 'object')
    for (const [key, value] of Object.entries(node)) texts(value, `${path}.${key}`, out);
  return out;
}

describe('the app locale', () => {
  it('has no stock "Please …" placeholder anywhere', () => {
    const all = texts(appLocale, 'locale', []);
    expect(all.length).toBeGreaterThan(50);
    for (const [path, text] of all) expect(text, path).not.toMatch(/please/i);
  });

  it('asks to choose in an empty select and shows the date form in an empty date field', () => {
    expect(appLocale.Select.placeholder).toBe('Choose…');
    expect(appLocale.Input.placeholder).toBe('');
    expect(appLocale.DatePicker.datePlaceholder).toBe('YYYY-MM-DD');
  });
});
