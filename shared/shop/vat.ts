/**
 * VAT arithmetic in integer minor units. Shop prices are kept VAT-inclusive; the VAT inside a gross amount is the
 * "VAT fraction" rate / (100 + rate) of it (1/6 at 20 %), rounded to the nearest minor unit.
 */

/**
 * The VAT contained in a VAT-inclusive amount.
 * @param grossMinor - amount with VAT, minor units
 * @param ratePct - VAT rate, e.g. 20
 */
export function vatInGross(grossMinor: number, ratePct: number): number {
  return Math.round((grossMinor * ratePct) / (100 + ratePct));
}

/**
 * A VAT-inclusive amount from a net one, rounded to the nearest minor unit.
 * @param netMinor - amount before VAT, minor units
 * @param ratePct - VAT rate, e.g. 20
 */
export function grossFromNet(netMinor: number, ratePct: number): number {
  return Math.round((netMinor * (100 + ratePct)) / 100);
}

/**
 * The amount before VAT of a VAT-inclusive amount (gross minus the VAT it contains).
 * @param grossMinor - amount with VAT, minor units
 * @param ratePct - VAT rate
 */
export function netOfGross(grossMinor: number, ratePct: number): number {
  return grossMinor - vatInGross(grossMinor, ratePct);
}
