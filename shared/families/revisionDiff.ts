import type { Axis, AxisValue, FamilySpec } from '../schemas/familySpec';
import type { RevisionDiff } from '../schemas/review';
import { variantCount } from './variantMatrix';

/** What the diff reads of a revision. */
export type DiffableRevision = Pick<
  FamilySpec,
  | 'name'
  | 'description'
  | 'templateId'
  | 'baseParams'
  | 'axes'
  | 'supportBudgetMm3'
  | 'printerId'
  | 'materialId'
  | 'region'
> &
  Partial<Pick<FamilySpec, 'targets' | 'printRecipe'>> & { number: number; templateVersion: number };

const same = (a: unknown, b: unknown): boolean => JSON.stringify(a) === JSON.stringify(b);

function valuesOf(axis: Axis | undefined): AxisValue[] {
  return axis ? [...axis.values] : [];
}

/**
 * The changes between two revisions: spec fields and base parameters (`baseParams.<key>`), and per axis which values
 * were added or removed (axes matched by key).
 * @param from - the older revision
 * @param to - the newer revision
 */
export function revisionDiff(from: DiffableRevision, to: DiffableRevision): RevisionDiff {
  const fields: RevisionDiff['fields'] = [];
  const scalar = [
    'name',
    'description',
    'templateId',
    'templateVersion',
    'supportBudgetMm3',
    'printerId',
    'materialId',
    'region',
    'targets',
    'printRecipe',
  ] as const;
  for (const field of scalar) {
    if (!same(from[field] ?? null, to[field] ?? null))
      fields.push({ field, from: from[field] ?? null, to: to[field] ?? null });
  }
  const paramKeys = [...new Set([...Object.keys(from.baseParams), ...Object.keys(to.baseParams)])].sort();
  for (const key of paramKeys) {
    const a = from.baseParams[key];
    const b = to.baseParams[key];
    if (!same(a, b)) fields.push({ field: `baseParams.${key}`, from: a ?? null, to: b ?? null });
  }
  const axisKeys = [...new Set([...from.axes.map((axis) => axis.key), ...to.axes.map((axis) => axis.key)])];
  const axes = axisKeys.map((key) => {
    const a = from.axes.find((axis) => axis.key === key);
    const b = to.axes.find((axis) => axis.key === key);
    const before = valuesOf(a);
    const after = valuesOf(b);
    const addedValues = after.filter((value) => !before.some((old) => same(old, value)));
    const removedValues = before.filter((value) => !after.some((next) => same(next, value)));
    const change = !a
      ? 'added'
      : !b
        ? 'removed'
        : addedValues.length || removedValues.length || !same(before, after)
          ? 'changed'
          : 'same';
    return { key, kind: (a ?? b)!.kind, change, addedValues, removedValues } as RevisionDiff['axes'][number];
  });
  return {
    from: from.number,
    to: to.number,
    fields,
    axes,
    variantCount: { from: variantCount(from.axes), to: variantCount(to.axes) },
  };
}
