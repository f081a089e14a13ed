/** The list of templates the product offers, and the look-up by id. */
import type { AnyTemplate } from './types';
import { gableBox } from './gableBox';
import { aFrame } from './aFrame';
import { roundPod } from './roundPod';
import { barkTrunk } from './barkTrunk';

/** Every template the product offers, in picker order. */
export const TEMPLATES: readonly AnyTemplate[] = [gableBox, aFrame, roundPod, barkTrunk] as unknown as AnyTemplate[];

/**
 * The template with this id, or undefined.
 * @param id - a template id such as `gable-box`
 */
export function findTemplate(id: string): AnyTemplate | undefined {
  return TEMPLATES.find((template) => template.id === id);
}
