/** Checks a family's content against its template, the printers and the materials: 400 naming the field. */
import { findSkuClashes } from '../../shared/families/sku';
import { variantCount } from '../../shared/families/variantMatrix';
import { FAMILY_MAX_VARIANTS, type Axis, type AxisValue } from '../../shared/schemas/familySpec';
import type { Material, PrinterProfile } from '../../shared/schemas/production';
import { findTemplate, parseParams, TemplateParamError } from '../../templates/index';
import { badRequest, type HttpError } from '../http/HttpError';

/** The parts of a family spec the check reads. */
export interface SpecToCheck {
  templateId: string;
  baseParams: Record<string, AxisValue>;
  axes: Axis[];
  printerId: string;
  materialId: string;
}

/** A 400 naming one body field, in the same shape as validate(). */
function fieldError(path: string, message: string): HttpError {
  return badRequest(`${path}: ${message}`, [{ in: 'body', path, message }]);
}

/**
 * Checks a spec and returns the template version to pin. Refuses: an unknown template, printer or material; base
 * parameters outside the template's ranges; a parameter axis whose key is not a template parameter or whose values
 * are out of range; colours a material does not come in; values that would share a SKU segment; and a matrix
 * larger than {@link FAMILY_MAX_VARIANTS}.
 * @param spec - the family content
 * @param printers - known printers by id
 * @param materials - known materials by id
 * @throws HttpError 400 whose message starts with the field path, e.g. `axes.0.values.2: ...`
 */
export function checkFamilySpec(
  spec: SpecToCheck,
  printers: ReadonlyMap<string, PrinterProfile>,
  materials: ReadonlyMap<string, Material>,
): { templateVersion: number } {
  const template = findTemplate(spec.templateId);
  if (!template) throw fieldError('templateId', `unknown template "${spec.templateId}"`);
  if (!printers.has(spec.printerId)) {
    throw fieldError('printerId', `unknown printer "${spec.printerId}" (known: ${[...printers.keys()].join(', ')})`);
  }
  if (!materials.has(spec.materialId)) {
    throw fieldError(
      'materialId',
      `unknown material "${spec.materialId}" (known: ${[...materials.keys()].join(', ')})`,
    );
  }
  try {
    parseParams(template, spec.baseParams);
  } catch (err) {
    if (err instanceof TemplateParamError) throw fieldError(`baseParams.${err.field}`, err.message);
    throw err;
  }
  const materialAxis = spec.axes.find((axis) => axis.kind === 'attribute' && axis.key === 'material');
  const usedMaterials = materialAxis ? materialAxis.values.map(String) : [spec.materialId];
  spec.axes.forEach((axis, axisIndex) => {
    if (axis.kind === 'param') {
      if (!(axis.key in template.parameters.shape)) {
        throw fieldError(
          `axes.${axisIndex}.key`,
          `${axis.key} is not a parameter of ${template.id} (known: ${Object.keys(template.parameters.shape).join(', ')})`,
        );
      }
      axis.values.forEach((value, valueIndex) => {
        try {
          parseParams(template, { ...spec.baseParams, [axis.key]: value });
        } catch (err) {
          if (err instanceof TemplateParamError)
            throw fieldError(`axes.${axisIndex}.values.${valueIndex}`, err.message);
          throw err;
        }
      });
      return;
    }
    axis.values.forEach((value, valueIndex) => {
      const path = `axes.${axisIndex}.values.${valueIndex}`;
      if (axis.key === 'material' && !materials.has(value)) {
        throw fieldError(path, `unknown material "${value}" (known: ${[...materials.keys()].join(', ')})`);
      }
      if (axis.key === 'colour') {
        for (const id of usedMaterials) {
          const material = materials.get(id);
          if (material && !material.colours.some((colour) => colour.id === value)) {
            throw fieldError(
              path,
              `${material.name} does not come in "${value}" (colours: ${material.colours.map((c) => c.id).join(', ')})`,
            );
          }
        }
      }
    });
  });
  const clash = findSkuClashes(spec.axes)[0];
  if (clash) throw fieldError(clash.path, clash.message);
  const count = variantCount(spec.axes);
  if (count > FAMILY_MAX_VARIANTS) {
    throw fieldError(
      'axes',
      `these axes make ${count} variants; a family holds at most ${FAMILY_MAX_VARIANTS}: remove values or split the family`,
    );
  }
  return { templateVersion: template.version };
}
