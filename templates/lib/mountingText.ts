/** The sentences that say what a box's back fits, shared by the templates that have a back. */
import { formatMmIn } from '../../shared/format/length';

/**
 * A back shaped to a trunk or pole of the given radius, or flat.
 * @param back - the curve the back is shaped to (`null`: a flat back)
 * @param widthMm - overall width of the body
 */
export function backMounting(back: { mountRadiusMm: number } | null, widthMm: number): string {
  if (back) {
    return (
      `Concave back shaped for a trunk or pole of ${formatMmIn(2 * back.mountRadiusMm)} diameter. ` +
      'On a thicker trunk it bears on its two side edges, on a thinner one along its centre line: fix with a strap or screws through the hanging hole.'
    );
  }
  return (
    `Flat back, ${formatMmIn(widthMm)} wide overall: flush on a flat post, board or wall. ` +
    'On a round pole or trunk it touches along one line: fix with a strap or a bracket.'
  );
}
