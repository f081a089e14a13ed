/**
 * A count with its noun in the right number: `countOf(1, 'part')` is "1 part", `countOf(3, 'part')` "3 parts".
 * @param n - how many
 * @param singular - the noun for one
 * @param plural - the noun for several (singular + "s" when omitted)
 */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
  return `${n.toLocaleString('en-GB')} ${n === 1 ? singular : plural}`;
}
