import type { ComputeState, Variant } from '../schemas/variant';
import type { Acknowledgement, FamilyGate, GateBlocker, GateWarning, GateWarningCode } from '../schemas/gate';
import { exceedsHeatDeflection, OUTDOOR_HEAT_SOURCE } from './outdoorHeat';
import { needsAcknowledgement } from './variantVerdict';
import { targetMisses } from './targetBlockers';
import { formatCm3 } from './formatCm3';

/** What the gate reads of a revision. */
export interface GateInput {
  computeState: ComputeState;
  supportBudgetMm3: number;
  /** The pinned template version and the version the server builds now. */
  templateVersion: number;
  currentTemplateVersion: number;
  variants: ReadonlyArray<
    Pick<Variant, 'sku' | 'status' | 'report' | 'birdFitWarnings' | 'error'> & Partial<Pick<Variant, 'cost'>>
  >;
  acknowledgements: readonly Acknowledgement[];
}

/**
 * The family gate: a family may be submitted only when every variant is computed, closed and manifold, fits the
 * printer, stays within the support budget and the family's production targets (unit cost, print hours, mass,
 * wall insulation), and every bird-fit warning that needs it is acknowledged in writing, as
 * is the `outdoor-heat` warning of variants whose roof or wall in full sun passes the material's heat-deflection
 * temperature.
 * @param input - the revision's computation, variants and acknowledgements
 * @returns ok, the blockers (with the SKUs concerned) and the warnings with their acknowledgements
 */
export function evaluateFamilyGate(input: GateInput): FamilyGate {
  const blockers: GateBlocker[] = [];
  const block = (code: GateBlocker['code'], message: string, skus: string[]): void => {
    if (skus.length > 0 || code === 'not_computed' || code === 'stale_template') blockers.push({ code, message, skus });
  };
  if (input.templateVersion !== input.currentTemplateVersion) {
    block(
      'stale_template',
      `the family pins template version ${input.templateVersion} but version ${input.currentTemplateVersion} is current; re-pin and compute again`,
      [],
    );
  }
  const pending = input.variants.filter((variant) => variant.status === 'pending').map((variant) => variant.sku);
  if (input.computeState !== 'done' || pending.length > 0) {
    blockers.push({
      code: 'not_computed',
      message: `${pending.length} of ${input.variants.length} variants are not computed yet; compute the family`,
      skus: pending,
    });
  }
  const failed = input.variants.filter((variant) => variant.status === 'failed');
  block(
    'generation_failed',
    'the template could not build these variants',
    failed.map((variant) => variant.sku),
  );
  const done = input.variants.filter((variant) => variant.status === 'done' && variant.report);
  block(
    'not_closed',
    'the mesh is not closed (open edges)',
    done.filter((v) => !v.report!.watertight || v.report!.openEdges > 0).map((v) => v.sku),
  );
  block(
    'not_manifold',
    'the mesh is not manifold',
    done.filter((v) => v.report!.nonManifoldEdges > 0).map((v) => v.sku),
  );
  block(
    'does_not_fit',
    'a part does not fit the printer',
    done.filter((v) => !v.report!.fitsPrinter).map((v) => v.sku),
  );
  block(
    'over_support_budget',
    `support volume is over the family budget of ${formatCm3(input.supportBudgetMm3)}`,
    done.filter((v) => v.report!.supportVolumeMm3 > input.supportBudgetMm3).map((v) => v.sku),
  );

  // Production targets: a variant over any target blocks, and the message names the worst one and what drives it.
  const currency = done.find((variant) => variant.cost)?.cost?.currency ?? '';
  const targeted = done.map((variant) => ({ sku: variant.sku, targetChecks: variant.report!.targetChecks ?? [] }));
  for (const miss of targetMisses(targeted, currency))
    blockers.push({ code: 'over_target', message: miss.message, skus: miss.skus });

  const byCode = new Map<GateWarningCode, GateWarning>();
  for (const variant of done) {
    for (const warning of variant.birdFitWarnings) {
      if (warning.severity === 'info') continue;
      let entry = byCode.get(warning.code);
      if (!entry) {
        entry = {
          code: warning.code,
          severity: warning.severity,
          message: warning.message,
          source: warning.source,
          skus: [],
          acknowledgement: input.acknowledgements.find((ack) => ack.code === warning.code) ?? null,
        };
        byCode.set(warning.code, entry);
      }
      if (warning.severity === 'warning') entry.severity = 'warning';
      if (!entry.skus.includes(variant.sku)) entry.skus.push(variant.sku);
    }
  }
  const birdFitWarnings = [...byCode.values()];
  const unacknowledged = birdFitWarnings.filter((warning) => needsAcknowledgement(warning) && !warning.acknowledgement);
  if (unacknowledged.length > 0) {
    blockers.push({
      code: 'birdfit_unacknowledged',
      message: `bird-fit warnings need a written acknowledgement: ${unacknowledged.map((w) => w.code).join(', ')}`,
      skus: [...new Set(unacknowledged.flatMap((warning) => warning.skus))],
    });
  }

  const hot = done.filter((variant) => exceedsHeatDeflection(variant.report!.outdoor));
  const warnings = [...birdFitWarnings];
  if (hot.length > 0) {
    const hottest = hot.reduce((a, b) => (solAirMax(b) > solAirMax(a) ? b : a)).report!.outdoor!;
    const heat: GateWarning = {
      code: 'outdoor-heat',
      severity: 'warning',
      message: hottest.cautions[0] ?? "a roof or wall in full sun passes the material's heat-deflection temperature",
      source: OUTDOOR_HEAT_SOURCE,
      skus: hot.map((variant) => variant.sku),
      acknowledgement: input.acknowledgements.find((ack) => ack.code === 'outdoor-heat') ?? null,
    };
    warnings.push(heat);
    if (!heat.acknowledgement) {
      blockers.push({
        code: 'outdoor_unacknowledged',
        message:
          "some colours get hotter in full sun than the material's heat-deflection temperature; acknowledge outdoor-heat in writing",
        skus: heat.skus,
      });
    }
  }
  return { ok: blockers.length === 0, blockers, warnings };
}

function solAirMax(variant: Pick<Variant, 'report'>): number {
  const outdoor = variant.report?.outdoor;
  return outdoor ? Math.max(outdoor.roof.solAirC, outdoor.wall.solAirC) : -Infinity;
}
