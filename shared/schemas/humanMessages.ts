import { z } from 'zod';
import type { $ZodRawIssue } from 'zod/v4/core';

/**
 * Field labels people see, by the key a schema uses, where the key read as words would not do. Any other key is
 * read as words (`customerName` → "Customer name", `holeAboveFloorMm` → "Hole above floor (mm)").
 */
const FIELD_LABELS: Record<string, string> = {
  sku: 'SKU',
  id: 'The identifier',
  email: 'E-mail address',
  code: 'Family code',
  url: 'Address',
  vatPct: 'Tax rate (%)',
  taxPct: 'Tax rate (%)',
  dimDivisors: 'Shipping divisors',
  hoursPerDay: 'Hours per day',
  copiesPerPlate: 'Copies per plate',
  minQuantity: 'Minimum quantity',
  vatRatePct: 'VAT rate (%)',
  line1: 'Address line 1',
  line2: 'Address line 2',
  postalCode: 'Postcode',
  weightBandsKg: 'Weight band (kg)',
  ratesMinor: 'Price',
  divisorId: 'Shipping divisor',
};

const UNIT_WORDS: [RegExp, string][] = [
  [/Mm$/, ' (mm)'],
  [/Mm2$/, ' (mm²)'],
  [/Mm3$/, ' (mm³)'],
  [/Cm3$/, ' (cm³)'],
  [/Deg$/, ' (°)'],
  [/Pct$/, ' (%)'],
  [/Min$/, ' (minutes)'],
  [/Cents$/, ''],
  [/Minor$/, ''],
  [/G$/, ' (g)'],
];

/**
 * The label of a field for a message, from the last named segment of its path: a known label, or the key read as
 * words with its unit in brackets. "This value" when the path names no field.
 * @param path - the issue's path (keys and array indices)
 */
export function fieldLabel(path: readonly PropertyKey[]): string {
  const key = [...path].reverse().find((part): part is string => typeof part === 'string');
  if (!key) return 'This value';
  if (FIELD_LABELS[key]) return FIELD_LABELS[key];
  let unit = '';
  let stem = key;
  for (const [pattern, words] of UNIT_WORDS) {
    if (pattern.test(stem) && stem.replace(pattern, '').length > 0) {
      unit = words;
      stem = stem.replace(pattern, '');
      break;
    }
  }
  const words = stem
    .replace(/([a-z0-9])([A-Z])/g, '$1 $2')
    .replace(/[_-]+/g, ' ')
    .toLowerCase();
  return `${words.charAt(0).toUpperCase()}${words.slice(1)}${unit}`;
}

/** A number as a message shows it (thousands grouped, at most 4 decimals). */
function num(value: unknown): string {
  const n = typeof value === 'bigint' ? Number(value) : Number(value);
  return Number.isFinite(n) ? n.toLocaleString('en-GB', { maximumFractionDigits: 4 }) : String(value);
}

const FORMATS: Record<string, string> = {
  date: 'a date such as 2027-03-01',
  datetime: 'a date and time',
  email: 'an e-mail address such as name@example.org',
  uuid: 'a valid identifier',
  guid: 'a valid identifier',
  url: 'a web address starting with https://',
};

type RawIssue = $ZodRawIssue;

/**
 * A sentence for one validation problem, written for people: the field's label and what is allowed, never the field
 * key or the validation library's own wording (`Customer name is required.`, `Quantity must be 100,000 or less.`).
 * @param issue - the raw issue zod reports
 */
export function humanIssueMessage(issue: RawIssue): string {
  const label = fieldLabel(issue.path ?? []);
  const i = issue as Record<string, unknown>;
  switch (issue.code) {
    case 'invalid_type': {
      if (issue.input === undefined || issue.input === null) return `${label} is required.`;
      const expected = String(i.expected);
      if (expected === 'int') return `${label} must be a whole number.`;
      if (expected === 'number') return `${label} must be a number.`;
      if (expected === 'boolean') return `${label} must be yes or no.`;
      if (expected === 'array') return `${label} must be a list.`;
      if (expected === 'object') return `${label} is missing or malformed.`;
      if (expected === 'string') return `${label} must be text.`;
      return `${label} has the wrong kind of value.`;
    }
    case 'too_small': {
      const origin = String(i.origin);
      const min = i.minimum;
      const inclusive = i.inclusive !== false;
      if (origin === 'string') {
        return Number(min) <= 1 ? `${label} is required.` : `${label} needs at least ${num(min)} characters.`;
      }
      if (origin === 'array' || origin === 'set') return `${label} needs at least ${num(min)} entries.`;
      if (origin === 'date') return `${label} must be on or after ${String(min)}.`;
      if (Number(min) === 0 && !inclusive) return `${label} must be more than 0.`;
      return inclusive ? `${label} must be at least ${num(min)}.` : `${label} must be more than ${num(min)}.`;
    }
    case 'too_big': {
      const origin = String(i.origin);
      const max = i.maximum;
      const inclusive = i.inclusive !== false;
      if (origin === 'string') return `${label} can be at most ${num(max)} characters long.`;
      if (origin === 'array' || origin === 'set') return `${label} can have at most ${num(max)} entries.`;
      return inclusive ? `${label} must be ${num(max)} or less.` : `${label} must be less than ${num(max)}.`;
    }
    case 'invalid_format': {
      const format = FORMATS[String(i.format)];
      return format ? `${label} must be ${format}.` : `${label} is not in the right form.`;
    }
    case 'invalid_value': {
      // A value written as a key (`printTimeMin`) is read as words, like a field name.
      const values = ((i.values as unknown[] | undefined) ?? []).map((value) =>
        typeof value === 'string' && /[a-z][A-Z]/.test(value) ? fieldLabel([value]).toLowerCase() : value,
      );
      return values.length === 1
        ? `${label} must be ${String(values[0])}.`
        : `${label} must be one of: ${values.map(String).join(', ')}.`;
    }
    case 'not_multiple_of':
      return `${label} must be a multiple of ${num(i.divisor)}.`;
    case 'unrecognized_keys': {
      const keys = (i.keys as string[] | undefined) ?? [];
      return `${keys.length === 1 ? 'This field is' : 'These fields are'} not known here: ${keys.join(', ')}.`;
    }
    case 'invalid_union':
      return `${label} does not match any allowed form.`;
    default:
      return `${label} is not valid.`;
  }
}

/**
 * A message as a sentence: first letter a capital, a full stop at the end when it has no closing mark. Schemas that
 * write their own short messages (`at most 6 axes`) reach people as sentences through this.
 * @param message - a validation message
 */
export function asSentence(message: string): string {
  const text = message.trim();
  if (!text) return text;
  const capital = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?:)”"]$/.test(capital) ? capital : `${capital}.`;
}

let installed = false;

/**
 * Makes every zod message in this process one of {@link humanIssueMessage}'s sentences (messages a schema writes
 * itself are kept). Idempotent; call it once at start-up on the server and in the browser.
 */
export function installHumanMessages(): void {
  if (installed) return;
  installed = true;
  z.config({ customError: (issue) => humanIssueMessage(issue) });
}

installHumanMessages();
