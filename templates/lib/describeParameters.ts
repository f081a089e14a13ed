import { z } from 'zod';
import type { AnyTemplate, ParameterDescription, ParameterUnit } from '../types';

interface JsonSchemaField {
  type?: string;
  minimum?: number;
  maximum?: number;
  default?: number | boolean | string;
  enum?: string[];
  label?: string;
  unit?: ParameterUnit;
  step?: number;
  help?: string;
}

/** Descriptions already read, by template: a schema never changes, and parseParams asks at every build. */
const described = new WeakMap<AnyTemplate, ParameterDescription[]>();

/**
 * Lists a template's parameters as plain JSON for the editor, the API and the CLI, read from the zod schema
 * (ranges, defaults, options) and each field's `.meta()` (label, unit, step, help). The schema is read once per
 * template; every call gets its own copies, so a caller may change them.
 * @param template - the template whose parameters to describe
 */
export function describeParameters(template: AnyTemplate): ParameterDescription[] {
  let list = described.get(template);
  if (!list) {
    list = readParameters(template);
    described.set(template, list);
  }
  return list.map((param) => (param.options ? { ...param, options: [...param.options] } : { ...param }));
}

function readParameters(template: AnyTemplate): ParameterDescription[] {
  const json = z.toJSONSchema(template.parameters, { io: 'input' }) as {
    properties?: Record<string, JsonSchemaField>;
  };
  return Object.entries(json.properties ?? {}).map(([key, field]) => {
    const kind: ParameterDescription['kind'] = field.type === 'boolean' ? 'boolean' : field.enum ? 'choice' : 'number';
    if (field.default === undefined) throw new Error(`Template ${template.id}: parameter ${key} has no default`);
    const description: ParameterDescription = {
      key,
      label: field.label ?? key,
      unit: field.unit ?? '',
      kind,
      default: field.default,
      help: field.help ?? '',
    };
    if (kind === 'number') {
      description.min = field.minimum;
      description.max = field.maximum;
      description.step = field.step ?? (field.type === 'integer' ? 1 : undefined);
    }
    if (kind === 'choice') description.options = field.enum;
    return description;
  });
}
