import { eq } from 'drizzle-orm';
import { describeTargetCheck, findTargetDrivers, type SensitivityParameter } from '../../shared/economics/checkTargets';
import type { TargetFigures, TargetKey } from '../../shared/schemas/wallRecipe';
import type { Material, PrintSettings } from '../../shared/schemas/production';
import type { VariantReport } from '../../shared/schemas/variant';
import { describeParameters, findTemplate } from '../../templates/index';
import type { Db } from '../db/client';
import { familyVariants } from '../db/schema';
import type { EvaluationContext } from './evaluateVariant';
import { evaluateVariant } from './evaluateVariant';
import type { VariantGeometry } from './variantGeometry';

/** The print recipe's own numeric parameters, moved like template parameters. */
const RECIPE_PARAMETERS: SensitivityParameter[] = [
  { key: 'perimeters', label: 'Perimeters', step: 1, unit: '', min: 1, max: 20 },
  { key: 'infillPct', label: 'Infill', step: 5, unit: '%', min: 0, max: 100 },
];

type VariantRow = typeof familyVariants.$inferSelect;

/**
 * For each production target some variant misses, works out on the variant that misses it worst which parameter
 * moves the figure most (finite differences: every numeric template parameter and the recipe's perimeters and infill
 * moved by one step, the variant built and evaluated again), and stores it in that variant's target checks and
 * reasons. Only the worst variant per target is probed, so a family over its targets costs a few dozen extra builds.
 * @param db - database
 * @param revisionId - the computed revision
 * @param templateId - its template
 * @param geometry - builds one parameter set (cached by the caller)
 * @param materials - materials by id (each variant is evaluated in its own)
 * @param context - the evaluation context of the revision (without the variant's material, colour and finish)
 */
export async function addTargetDrivers(
  db: Db,
  revisionId: string,
  templateId: string,
  geometry: (params: Record<string, unknown>) => Promise<VariantGeometry>,
  materials: ReadonlyMap<string, Material>,
  context: Omit<EvaluationContext, 'material'> & { settings: PrintSettings },
): Promise<void> {
  const template = findTemplate(templateId);
  if (!template) return;
  const rows = await db.select().from(familyVariants).where(eq(familyVariants.revisionId, revisionId));
  const worst = new Map<VariantRow, TargetKey[]>();
  for (const key of ['unit-cost', 'print-hours', 'mass', 'insulation'] as const) {
    let pick: { row: VariantRow; pct: number } | null = null;
    for (const row of rows) {
      const check = row.report?.targetChecks?.find((c) => c.key === key && !c.met);
      if (check && (!pick || check.overByPct > pick.pct)) pick = { row, pct: check.overByPct };
    }
    if (pick) worst.set(pick.row, [...(worst.get(pick.row) ?? []), key]);
  }
  const parameters: SensitivityParameter[] = [
    ...describeParameters(template)
      .filter((param) => param.kind === 'number' && param.min !== undefined && param.max !== undefined)
      .map((param) => ({
        key: param.key,
        label: param.label,
        step: param.step ?? (param.max! - param.min!) / 100,
        unit: param.unit,
        min: param.min!,
        max: param.max!,
      })),
    ...RECIPE_PARAMETERS,
  ];
  for (const [row, keys] of worst) {
    const report = row.report as VariantReport;
    const material = materials.get(row.attributes.material);
    if (!material) continue;
    const variantContext: EvaluationContext = {
      ...context,
      material,
      colourId: row.attributes.colour,
      finishId: row.attributes.finish,
    };
    const figuresOf = (evaluation: ReturnType<typeof evaluateVariant>): TargetFigures => ({
      unitCostCents: evaluation.cost.costCents,
      printTimeMin: evaluation.report.printTimeMin,
      massG: evaluation.report.massG,
      wallRM2KW: evaluation.report.targetChecks.find((c) => c.key === 'insulation')?.value ?? null,
    });
    const base = figuresOf(evaluateVariant(await geometry(row.params), variantContext));
    const values: Record<string, number> = {
      ...Object.fromEntries(
        Object.entries(row.params).filter((entry): entry is [string, number] => typeof entry[1] === 'number'),
      ),
      perimeters: context.settings.perimeters,
      infillPct: context.settings.infillPct,
    };
    const drivers = await findTargetDrivers(
      base,
      values,
      parameters,
      async (changed) => {
        const [key, value] = Object.entries(changed)[0]!;
        if (key === 'perimeters' || key === 'infillPct') {
          const settings = { ...context.settings, [key]: value };
          return figuresOf(evaluateVariant(await geometry(row.params), { ...variantContext, settings }));
        }
        return figuresOf(evaluateVariant(await geometry({ ...row.params, [key]: value }), variantContext));
      },
      keys,
    );
    const currency = row.cost?.currency ?? '';
    const targetChecks = report.targetChecks.map((check) =>
      keys.includes(check.key) ? { ...check, driver: drivers[check.key] } : check,
    );
    const reasons = [
      ...targetChecks.filter((check) => !check.met).map((check) => describeTargetCheck(check, currency)),
      ...row.reasons.filter(
        (reason) => !report.targetChecks.some((check) => !check.met && reason.startsWith(check.label.toLowerCase())),
      ),
    ];
    await db
      .update(familyVariants)
      .set({ report: { ...report, targetChecks }, reasons, updatedAt: new Date() })
      .where(eq(familyVariants.id, row.id));
  }
}
