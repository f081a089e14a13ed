import type { BirdFitWarning } from '../schemas/birdfit';
import type { VariantReport, VariantVerdict } from '../schemas/variant';
import { outdoorHeatReasons } from './outdoorHeat';
import { formatCm3 } from './formatCm3';

/** Bird-fit severities that must be acknowledged in writing before a family can be submitted. */
export const ACK_REQUIRED_SEVERITIES: ReadonlyArray<BirdFitWarning['severity']> = ['warning'];

/**
 * Whether a bird-fit warning needs a written acknowledgement.
 * @param warning - a warning from assessBirdFit
 */
export function needsAcknowledgement(warning: Pick<BirdFitWarning, 'severity'>): boolean {
  return ACK_REQUIRED_SEVERITIES.includes(warning.severity);
}

/**
 * The verdict of one computed variant: `fail` when the mesh is open or non-manifold, does not fit the printer or
 * needs more support than the family's budget; `warn` when bird-fit warnings need acknowledging or a roof or wall in
 * full sun passes the material's heat-deflection temperature (report.outdoor); otherwise `pass`.
 * @param report - the variant's print-readiness summary
 * @param supportBudgetMm3 - the family's support budget
 * @param warnings - the variant's bird-fit warnings
 * @param materialName - the material's display name for the heat reasons (defaults to the material id)
 * @param printerName - the printer's display name for the fit reason (defaults to the printer id)
 * @returns the verdict and every reason for it
 */
export function variantVerdict(
  report: Pick<
    VariantReport,
    'watertight' | 'openEdges' | 'nonManifoldEdges' | 'fitsPrinter' | 'printerId' | 'supportVolumeMm3'
  > &
    Partial<Pick<VariantReport, 'outdoor'>>,
  supportBudgetMm3: number,
  warnings: readonly Pick<BirdFitWarning, 'code' | 'severity'>[],
  materialName?: string,
  printerName?: string,
): { verdict: VariantVerdict; reasons: string[] } {
  const reasons: string[] = [];
  if (!report.watertight || report.openEdges > 0) reasons.push(`mesh is not closed (${report.openEdges} open edges)`);
  if (report.nonManifoldEdges > 0) reasons.push(`mesh is not manifold (${report.nonManifoldEdges} non-manifold edges)`);
  if (!report.fitsPrinter)
    reasons.push(`a part does not fit the build volume of the ${printerName ?? report.printerId}`);
  if (report.supportVolumeMm3 > supportBudgetMm3) {
    reasons.push(
      `support ${formatCm3(report.supportVolumeMm3)} is over the family budget of ${formatCm3(supportBudgetMm3)}`,
    );
  }
  if (reasons.length > 0) return { verdict: 'fail', reasons };
  const toAck = warnings.filter(needsAcknowledgement).map((warning) => warning.code);
  if (toAck.length > 0) reasons.push(birdFitAckReason(toAck, false));
  if (report.outdoor) reasons.push(...outdoorHeatReasons(report.outdoor, materialName ?? report.outdoor.materialId));
  return { verdict: reasons.length > 0 ? 'warn' : 'pass', reasons };
}

const TO_ACKNOWLEDGE = 'bird-fit warnings to acknowledge: ';
const ACKNOWLEDGED = 'bird-fit warnings acknowledged in writing: ';

/** A warning code in words (`thin-walls` → "thin walls"). */
function codeWords(code: string): string {
  return code.replace(/[-_]/g, ' ');
}

/** The reason a row shows for bird-fit warnings, still to acknowledge or acknowledged. */
function birdFitAckReason(codes: readonly string[], acknowledged: boolean): string {
  return `${acknowledged ? ACKNOWLEDGED : TO_ACKNOWLEDGE}${codes.map(codeWords).join(', ')}`;
}

/**
 * A variant's reasons as they read now that some warnings have been acknowledged for its revision: the stored
 * "to acknowledge" reason is split into the codes still waiting and the codes acknowledged in writing, taken from
 * the variant's own bird-fit warnings (the stored verdict was computed before any acknowledgement).
 * @param variant - the stored reasons and bird-fit warnings
 * @param acknowledged - the warning codes acknowledged for the variant's revision
 * @returns the reasons to show
 */
export function reasonsAfterAcknowledgements(
  variant: { reasons: readonly string[]; birdFitWarnings: readonly Pick<BirdFitWarning, 'code' | 'severity'>[] },
  acknowledged: ReadonlySet<string>,
): string[] {
  const codes = variant.birdFitWarnings.filter(needsAcknowledgement).map((warning) => warning.code);
  const waiting = codes.filter((code) => !acknowledged.has(code));
  const done = codes.filter((code) => acknowledged.has(code));
  const out: string[] = [];
  for (const reason of variant.reasons) {
    if (!reason.startsWith(TO_ACKNOWLEDGE)) {
      out.push(reason);
      continue;
    }
    if (waiting.length > 0) out.push(birdFitAckReason(waiting, false));
    if (done.length > 0) out.push(birdFitAckReason(done, true));
  }
  return out;
}
