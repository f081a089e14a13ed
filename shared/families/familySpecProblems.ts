/**
 * What is wrong with a family's content against its template, the printers and the materials, as a list of
 * problems each naming its field. Pure: the server turns the first problem into a 400 naming the field
 * (server/services/familySpecCheck.ts); the family editor shows them before it submits.
 */
import { findSkuClashes } from './sku';
import { variantCount } from './variantMatrix';
import { FAMILY_MAX_VARIANTS, type Axis, type AxisValue } from '../schemas/familySpec';
import type { Material, PrinterProfile } from '../schemas/production';

/** The parts of a family spec the check reads. */
export interface SpecToCheck {
  templateId: string;
  baseParams: Record<string, AxisValue>;
  axes: Axis[];
  printerId: string;
  materialId: string;
}

/** One problem of a family spec: the field path (`axes.0.values.2`, `printerId`) and a message for people. */
export interface SpecProblem {
  path: string;
  message: string;
}

/** What the check needs of the pinned template (the server reads the template itself, the editor its summary). */
export interface SpecTemplate {
  id: string;
  version: number;
  /** Keys of the template's parameters. */
  parameterKeys: readonly string[];
  /**
   * The first problem of a parameter set (missing keys take the defaults), or null when the template accepts it.
   * `field` is the parameter key.
   */
  paramProblem(params: Record<string, AxisValue>): { field: string; message: string } | null;
}

/** The result of {@link familySpecProblems}. */
export interface SpecCheck {
  problems: SpecProblem[];
  /** The template version to pin; null when the template is unknown. */
  templateVersion: number | null;
}

/**
 * Checks a spec. Problems: an unknown template, printer or material; base parameters outside the template's
 * ranges; a parameter axis whose key is not a template parameter or whose values are out of range; colours a
 * material does not come in; values that would share a SKU segment; and a matrix larger than
 * {@link FAMILY_MAX_VARIANTS}. The first problem is the one the server reports.
 * @param spec - the family content
 * @param template - the pinned template, undefined when there is no such template
 * @param printers - known printers by id
 * @param materials - known materials by id
 */
export function familySpecProblems(
  spec: SpecToCheck,
  template: SpecTemplate | undefined,
  printers: ReadonlyMap<string, PrinterProfile>,
  materials: ReadonlyMap<string, Material>,
): SpecCheck {
  const problems: SpecProblem[] = [];
  const add = (path: string, message: string) => problems.push({ path, message });
  if (!template) {
    add('templateId', `unknown template "${spec.templateId}"`);
    return { problems, templateVersion: null };
  }
  if (!printers.has(spec.printerId)) {
    add('printerId', `unknown printer "${spec.printerId}" (known: ${[...printers.keys()].join(', ')})`);
  }
  if (!materials.has(spec.materialId)) {
    add('materialId', `unknown material "${spec.materialId}" (known: ${[...materials.keys()].join(', ')})`);
  }
  const base = template.paramProblem(spec.baseParams);
  if (base) add(`baseParams.${base.field}`, base.message);
  const materialAxis = spec.axes.find((axis) => axis.kind === 'attribute' && axis.key === 'material');
  const usedMaterials = materialAxis ? materialAxis.values.map(String) : [spec.materialId];
  spec.axes.forEach((axis, axisIndex) => {
    if (axis.kind === 'param') {
      if (!template.parameterKeys.includes(axis.key)) {
        add(
          `axes.${axisIndex}.key`,
          `${axis.key} is not a parameter of ${template.id} (known: ${template.parameterKeys.join(', ')})`,
        );
        return;
      }
      // A base parameter out of range is reported once, above, not again for every axis value.
      if (base) return;
      axis.values.forEach((value, valueIndex) => {
        const problem = template.paramProblem({ ...spec.baseParams, [axis.key]: value });
        if (problem) add(`axes.${axisIndex}.values.${valueIndex}`, problem.message);
      });
      return;
    }
    axis.values.forEach((value, valueIndex) => {
      const path = `axes.${axisIndex}.values.${valueIndex}`;
      if (axis.key === 'material' && !materials.has(value)) {
        add(path, `unknown material "${value}" (known: ${[...materials.keys()].join(', ')})`);
      }
      if (axis.key === 'colour') {
        for (const id of usedMaterials) {
          const material = materials.get(id);
          if (material && !material.colours.some((colour) => colour.id === value)) {
            add(
              path,
              `${material.name} does not come in "${value}" (colours: ${material.colours.map((c) => c.id).join(', ')})`,
            );
          }
        }
      }
    });
  });
  for (const clash of findSkuClashes(spec.axes)) add(clash.path, clash.message);
  const count = variantCount(spec.axes);
  if (count > FAMILY_MAX_VARIANTS) {
    add(
      'axes',
      `these axes make ${count} variants; a family holds at most ${FAMILY_MAX_VARIANTS}: remove values or split the family`,
    );
  }
  return { problems, templateVersion: template.version };
}
