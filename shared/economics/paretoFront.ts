/** What the front compares: lower cost and time are better, higher R is better. */
export interface TradeOff {
  unitCostCents: number;
  printTimeMin: number;
  rM2KW: number;
}

/**
 * Whether `a` dominates `b`: no worse on cost, time and R, and better on at least one.
 * @param a - one point
 * @param b - the other
 */
export function dominates(a: TradeOff, b: TradeOff): boolean {
  const noWorse = a.unitCostCents <= b.unitCostCents && a.printTimeMin <= b.printTimeMin && a.rM2KW >= b.rM2KW;
  return noWorse && (a.unitCostCents < b.unitCostCents || a.printTimeMin < b.printTimeMin || a.rM2KW > b.rM2KW);
}

/**
 * The Pareto front of cost, print time and R: the points no other point dominates, cheapest first. Points are
 * visited cheapest first (then fastest, then best insulating), so a point can only be dominated by one already on the
 * front: O(n log n + n·f) for a front of f points. Exact duplicates keep one copy.
 * @param points - the candidates
 * @returns the non-dominated points sorted by cost, then time
 */
export function paretoFront<T extends TradeOff>(points: readonly T[]): T[] {
  const sorted = [...points].sort(
    (a, b) => a.unitCostCents - b.unitCostCents || a.printTimeMin - b.printTimeMin || b.rM2KW - a.rM2KW,
  );
  const front: T[] = [];
  for (const p of sorted) {
    if (
      front.some(
        (q) =>
          dominates(q, p) ||
          (q.unitCostCents === p.unitCostCents && q.printTimeMin === p.printTimeMin && q.rM2KW === p.rM2KW),
      )
    )
      continue;
    front.push(p);
  }
  return front;
}
