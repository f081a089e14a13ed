import { describeTargetCheck } from '../economics/checkTargets';
import type { TargetCheck, TargetKey } from '../schemas/wallRecipe';

/** What the gate reads of a variant for its targets. */
export interface TargetedVariant {
  sku: string;
  targetChecks: readonly TargetCheck[];
}

/** One missed target across a family: the variants over it and the worst one in words. */
export interface TargetMiss {
  key: TargetKey;
  message: string;
  skus: string[];
}

/**
 * The family's missed targets: for each target, the variants over it and a message that names the worst variant,
 * by how much it misses and the parameter that moves it most, e.g. "unit cost over target in 4 variants: worst
 * FH-HGB-32-SHIN-MOSS, unit cost 38.10 EUR is 2.10 EUR (6 %) over the 36.00 EUR target; wall thickness moves it most
 * (+0.5 mm adds 1.05 EUR)".
 * @param variants - computed variants with their target checks
 * @param currency - currency of the cost figures
 * @returns one miss per target that some variant misses, in target order
 */
export function targetMisses(variants: readonly TargetedVariant[], currency: string): TargetMiss[] {
  const misses: TargetMiss[] = [];
  for (const key of ['unit-cost', 'print-hours', 'mass', 'insulation'] as const) {
    const over = variants
      .map((variant) => ({ sku: variant.sku, check: variant.targetChecks.find((c) => c.key === key && !c.met) }))
      .filter((entry): entry is { sku: string; check: TargetCheck } => entry.check !== undefined);
    if (over.length === 0) continue;
    const worst = over.reduce((a, b) => (b.check.overByPct > a.check.overByPct ? b : a));
    const count = over.length === 1 ? '1 variant' : `${over.length} variants`;
    misses.push({
      key,
      message: `${worst.check.label.toLowerCase()} misses the target in ${count}: worst ${worst.sku}, ${describeTargetCheck(worst.check, currency)}`,
      skus: over.map((entry) => entry.sku),
    });
  }
  return misses;
}
