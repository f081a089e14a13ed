/**
 * Every validation message a person can meet is written for people: no field keys (camelCase), no validation-library
 * wording ("expected", "Too big", "Invalid input"). The test walks each input schema with typical bad values for
 * every field and reads every message zod produces. Wording rules are our own house style: common practice, no source.
 */
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { ZodObject, type z } from 'zod';
import { asSentence, fieldLabel, humanIssueMessage } from '../shared/schemas/humanMessages';
import { PersonCreateSchema, PersonUpdateSchema, SignInSchema } from '../shared/schemas/auth';
import { QuoteInputSchema, QuoteLineInputSchema } from '../shared/schemas/quote';
import { PresetCreateSchema, PresetUpdateSchema } from '../shared/schemas/preset';
import { SalesSettingsSchema } from '../shared/schemas/sales';
import { AnalysisRequestSchema } from '../shared/schemas/analysis';
import { TemplateLimitsRequestSchema } from '../shared/schemas/templateLimits';
import { DEFAULT_SALES_SETTINGS } from '../server/services/salesSettings';

/** Values people (or a broken client) typically send. */
const BAD_VALUES: unknown[] = [undefined, null, '', '   ', -1, 0, 2.5, 1e12, 'abc', [], {}, true, '2020-01-01'];

/** Each input schema with one valid body. */
const SCHEMAS: Array<[string, z.ZodType, Record<string, unknown>]> = [
  ['sign-in', SignInSchema, { email: 'ada@fernhollow.test', password: 'fernhollow-demo' }],
  ['new person', PersonCreateSchema, { name: 'Ada', email: 'ada@x.test', password: 'long-enough-1', roles: ['sales'] }],
  ['person update', PersonUpdateSchema, { name: 'Ada', roles: ['sales'] }],
  [
    'quote',
    QuoteInputSchema,
    {
      customerName: 'Wren & Co',
      deliveryDate: '2099-01-01',
      validUntil: '2099-01-01',
      terms: 'Net 30 days',
      taxRatePct: 20,
      shippingCents: 3500,
      lines: [{ sku: 'FH-X-1', quantity: 3 }],
    },
  ],
  ['quote line', QuoteLineInputSchema, { sku: 'FH-X-1', quantity: 3, unitPriceCents: 1250 }],
  ['preset', PresetCreateSchema, { templateId: 'gable-box', name: 'Blue tit', params: {} }],
  ['preset update', PresetUpdateSchema, { name: 'Blue tit' }],
  ['sales settings', SalesSettingsSchema, structuredClone(DEFAULT_SALES_SETTINGS) as Record<string, unknown>],
  ['analysis request', AnalysisRequestSchema, { up: '+z', infillPct: 15 }],
  ['template limits', TemplateLimitsRequestSchema, { params: {} }],
];

const CAMEL_KEY = /\b[a-z]+[A-Z][A-Za-z0-9]*\b/;
const LIBRARY_WORDING =
  /expected|received|Too big|Too small|Invalid input|Invalid option|Invalid ISO|Invalid email|Invalid string/;

/** Every message zod gives for the valid body with one field (at any depth of plain objects) replaced by a bad value. */
function messagesFor(schema: z.ZodType, valid: Record<string, unknown>): string[] {
  const messages: string[] = [];
  const visit = (path: string[], value: unknown): void => {
    for (const bad of BAD_VALUES) {
      const body = structuredClone(valid);
      let target = body as Record<string, unknown>;
      for (const key of path.slice(0, -1)) target = target[key] as Record<string, unknown>;
      target[path[path.length - 1]] = bad;
      const result = schema.safeParse(body);
      if (!result.success) messages.push(...result.error.issues.map((issue) => issue.message));
    }
    if (value && typeof value === 'object' && !Array.isArray(value)) {
      for (const [key, inner] of Object.entries(value)) visit([...path, key], inner);
    }
  };
  for (const [key, value] of Object.entries(valid)) visit([key], value);
  return messages;
}

describe.each(SCHEMAS)('messages of the %s schema', (_name, schema, valid) => {
  it('accepts the valid body', () => {
    expect(schema.safeParse(valid).success).toBe(true);
  });

  it('name no field key and use no library wording, for every typical bad value of every field', () => {
    const messages = messagesFor(schema, valid);
    expect(messages.length).toBeGreaterThan(0);
    for (const message of messages) {
      expect(message, message).not.toMatch(CAMEL_KEY);
      expect(message, message).not.toMatch(LIBRARY_WORDING);
      expect(message, message).toMatch(/^[A-Z"].*[.:)]$|^[A-Z]/);
    }
  });
});

describe('text fields are trimmed before they are checked', () => {
  it('refuses a person named with spaces only', () => {
    const result = PersonCreateSchema.safeParse({
      name: '   ',
      email: 'a@b.test',
      password: 'long-enough-1',
      roles: ['sales'],
    });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0].message).toBe('Give the person a name.');
    expect(PersonUpdateSchema.safeParse({ name: ' \t ' }).success).toBe(false);
  });

  it('stores names without the surrounding spaces', () => {
    expect(PersonUpdateSchema.parse({ name: '  Ada Wren ' }).name).toBe('Ada Wren');
    expect(
      QuoteInputSchema.parse({
        lines: [{ sku: ' FH-X-1 ', quantity: 1 }],
        deliveryDate: '2099-01-01',
        customerName: ' Wren ',
        terms: '  Net 30 days ',
      }),
    ).toMatchObject({ lines: [{ sku: 'FH-X-1' }], customerName: 'Wren', terms: 'Net 30 days' });
  });
});

describe('field labels', () => {
  it('reads keys as words, with their unit', () => {
    expect(fieldLabel(['customerName'])).toBe('Customer name');
    expect(fieldLabel(['farm', 'hoursPerDay'])).toBe('Hours per day');
    expect(fieldLabel(['quantityBreaks', 2, 'discountPct'])).toBe('Discount (%)');
    expect(fieldLabel(['wallThicknessMm'])).toBe('Wall thickness (mm)');
    expect(fieldLabel([])).toBe('This value');
  });

  it('words a too-big number with its limit, grouped', () => {
    expect(
      humanIssueMessage({
        code: 'too_big',
        origin: 'number',
        maximum: 100000,
        inclusive: true,
        path: ['quantity'],
        input: 1e6,
      } as never),
    ).toBe('Quantity must be 100,000 or less.');
  });
});

/** Unwraps optional, nullable, default and pipe wrappers to the schema inside. */
function inner(schema: z.ZodType): z.ZodType {
  let current = schema as z.ZodType & { def: { innerType?: z.ZodType; in?: z.ZodType; type: string } };
  for (let i = 0; i < 8; i++) {
    const def = current.def;
    const next = def.innerType ?? (def.type === 'pipe' ? def.in : undefined);
    if (!next) break;
    current = next as typeof current;
  }
  return current;
}

/**
 * Every message an object schema gives when one of its fields (and the fields of objects inside it, two levels
 * deep) holds a typical bad value and the rest is missing: required, too big, too small and wrong kind for each field.
 */
function messagesOfShape(schema: z.ZodObject, depth = 0): string[] {
  const messages: string[] = [];
  for (const [key, field] of Object.entries(schema.shape as Record<string, z.ZodType>)) {
    for (const bad of BAD_VALUES) {
      const result = schema.safeParse({ [key]: bad });
      if (!result.success) messages.push(...result.error.issues.map((issue) => issue.message));
    }
    const nested = inner(field);
    if (depth < 2 && nested instanceof ZodObject) {
      for (const message of messagesOfShape(nested, depth + 1)) messages.push(message);
    }
  }
  return messages;
}

describe('every object schema the API and the screens share names no key and uses no library wording', () => {
  const dir = join(dirname(fileURLToPath(import.meta.url)), '../shared/schemas');
  const files = readdirSync(dir).filter((file) => file.endsWith('.ts') && file !== 'humanMessages.ts');

  it.each(files)('%s', async (file) => {
    const module = (await import(`../shared/schemas/${file}`)) as Record<string, unknown>;
    const schemas = Object.entries(module).filter(
      (entry): entry is [string, z.ZodObject] => entry[1] instanceof ZodObject,
    );
    for (const [name, schema] of schemas) {
      for (const message of messagesOfShape(schema)) {
        expect(message, `${name}: ${message}`).not.toMatch(CAMEL_KEY);
        expect(message, `${name}: ${message}`).not.toMatch(LIBRARY_WORDING);
        // The API sends it as a sentence (server/http/validate.ts): a capital first, a closing mark last.
        expect(asSentence(message), `${name}: ${message}`).toMatch(/^[A-Z“"0-9].*[.!?:)”"]$/);
      }
    }
  });
});
