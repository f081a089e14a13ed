/**
 * What an acknowledged finding means for publishing. An acknowledgement lets a family through review; it does not
 * by itself make a product fit to sell. Per finding, either publishing is blocked (no written reason makes it safe
 * for the birds or true to the buyer) or the customer documents state the acknowledged limit plainly with the
 * studio's reason. The README's "Publishing with acknowledged findings" table lists the same decisions.
 */
import type { GateWarning, GateWarningCode } from '../schemas/gate';

/** `block`: the family cannot be published while any variant has the finding; `state`: the spec sheet says it. */
export type PublishTreatment = 'block' | 'state';

/** The decision for each finding, with the reason given to the person who tries to publish. */
export const PUBLISH_POLICY: Record<GateWarningCode, { treatment: PublishTreatment; why: string }> = {
  'no-drainage': {
    treatment: 'block',
    why: 'without drainage holes rain that gets in stays in, and nestlings can chill or drown',
  },
  'no-ventilation': {
    treatment: 'block',
    why: 'without ventilation a box in sun overheats, and no siting advice on a sheet fixes that',
  },
  'no-species-match': {
    treatment: 'block',
    why: 'a nest box that suits none of the species in the table cannot honestly be sold for any bird',
  },
  'hole-too-high-for-cavity': {
    treatment: 'state',
    why: 'the entry reaches the roof line; the box still works for the species listed, and the sheet says so',
  },
  perch: { treatment: 'state', why: 'the buyer can take a perch off; the sheet says why it should go' },
  'admits-starlings': { treatment: 'state', why: 'a regional matter: the sheet says where the entry size is unwise' },
  'admits-house-sparrows': {
    treatment: 'state',
    why: 'a regional matter: the sheet says where the entry size is unwise',
  },
  'hole-low-above-floor': { treatment: 'state', why: 'the sheet gives the height and the guidance beside it' },
  'thin-walls': {
    treatment: 'state',
    why: 'the sheet gives the wall figure beside a pine board and the siting advice',
  },
  'no-cleaning-access': { treatment: 'state', why: 'the sheet says how the box is cleaned, or that it cannot be' },
  'mounting-height': { treatment: 'state', why: 'guidance for the buyer' },
  'predator-guard': { treatment: 'state', why: 'guidance for the buyer' },
  'plastic-heat': { treatment: 'state', why: 'guidance for the buyer' },
  'outdoor-heat': {
    treatment: 'state',
    why: 'a colour that passes the heat limit in full sun can still suit a shaded site; the sheet says which',
  },
};

/** A finding in words (`no-drainage` → "no drainage"). */
export function findingWords(code: string): string {
  return code.replace(/[-_]/g, ' ');
}

/**
 * The findings that block publishing, acknowledged or not (information-only notes never block).
 * @param warnings - the gate's warnings of the revision
 */
export function publishBlockers(warnings: readonly GateWarning[]): GateWarning[] {
  return warnings.filter((w) => w.severity !== 'info' && PUBLISH_POLICY[w.code]?.treatment === 'block');
}

/**
 * The refusal a person sees when publishing is blocked: each finding, the variants, and why no acknowledgement lifts it.
 * @param blocked - from {@link publishBlockers}
 */
export function publishRefusal(blocked: readonly GateWarning[]): string {
  const lines = blocked.map((w) => `${findingWords(w.code)} (${w.skus.join(', ')}): ${PUBLISH_POLICY[w.code].why}`);
  return (
    `This family cannot be published: ${lines.join('; ')}. An acknowledgement does not lift this; ` +
    'change the design, compute again and send it for review.'
  );
}

/**
 * The sentence a customer document adds under an acknowledged finding it states: the studio's written reason.
 * @param text - the acknowledgement's text
 */
export function studioReason(text: string): string {
  const trimmed = text.trim();
  return trimmed ? `The studio's note on this limit: ${trimmed}` : '';
}
