/** Dispatch rows as the API shows them: on the order page (with reprint cost) and in the exceptions queue. */
import { and, desc, eq, inArray } from 'drizzle-orm';
import type { Dispatch, FarmException, FarmExceptionsResponse, OrderFulfilment } from '../../shared/schemas/fulfilment';
import { formatOrderNumber } from '../../shared/schemas/order';
import type { Db } from '../db/client';
import { familyVariants, farmDispatches, orders, type FarmDispatchRow } from '../db/schema';

/**
 * A dispatch row as the API shows it.
 * @param row - the stored row
 */
export function toDispatch(row: FarmDispatchRow): Dispatch {
  return {
    id: row.id,
    orderId: row.orderId,
    runId: row.runId,
    attempt: row.attempt,
    status: row.status,
    failures: row.failures,
    lastError: row.lastError,
    nextAttemptAt: row.status === 'waiting' || row.status === 'queued' ? row.nextAttemptAt.toISOString() : null,
    farmWorkOrderId: row.farmWorkOrderId,
    farmStage: row.farmStage,
    holdCode: row.holdCode,
    holdMessage: row.holdMessage,
    carrier: row.carrier,
    trackingCode: row.trackingCode,
    trackingUrl: row.trackingUrl,
    reprints: row.reprints,
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/**
 * The farm side of an order: its dispatches (newest first) and what the reprints cost: each reprinted plate of a
 * line counts one unit's material, machine time and energy of that variant (the engine's breakdown).
 * @param db - database
 * @param orderId - the order
 */
export async function fulfilmentOf(db: Db, orderId: string): Promise<OrderFulfilment> {
  const rows = await db
    .select()
    .from(farmDispatches)
    .where(eq(farmDispatches.orderId, orderId))
    .orderBy(desc(farmDispatches.attempt));
  const bySku = new Map<string, number>();
  for (const row of rows)
    for (const [sku, n] of Object.entries(row.reprintsBySku)) bySku.set(sku, (bySku.get(sku) ?? 0) + n);
  let reprintCostMinor = 0;
  if (bySku.size > 0) {
    const variants = await db
      .select({ sku: familyVariants.sku, cost: familyVariants.cost })
      .from(familyVariants)
      .where(inArray(familyVariants.sku, [...bySku.keys()]));
    for (const [sku, n] of bySku) {
      const b = variants.find((v) => v.sku === sku && v.cost)?.cost?.breakdown;
      if (b) reprintCostMinor += n * (b.materialCents + b.machineTimeCents + b.energyCents);
    }
  }
  return {
    dispatches: rows.map(toDispatch),
    reprints: rows.reduce((sum, row) => sum + row.reprints, 0),
    reprintCostMinor,
  };
}

/**
 * The exceptions queue: dispatches the farm holds (address, colour, refusal) and those waiting for a farm that
 * cannot be reached, oldest first, with their order.
 * @param db - database
 */
export async function listFarmExceptions(db: Db): Promise<FarmExceptionsResponse> {
  const rows = await db
    .select({ dispatch: farmDispatches, number: orders.number, email: orders.email, shipTo: orders.shipTo })
    .from(farmDispatches)
    .leftJoin(orders, eq(orders.id, farmDispatches.orderId))
    .where(and(inArray(farmDispatches.status, ['held', 'waiting'])))
    .orderBy(farmDispatches.createdAt);
  const view = (row: (typeof rows)[number]): FarmException => ({
    ...toDispatch(row.dispatch),
    orderNumber: row.number ? formatOrderNumber(row.number) : null,
    email: row.email,
    shipTo: row.shipTo
      ? (Object.fromEntries(Object.entries(row.shipTo).map(([k, v]) => [k, String(v)])) as Record<string, string>)
      : null,
  });
  return {
    held: rows.filter((row) => row.dispatch.status === 'held').map(view),
    waiting: rows.filter((row) => row.dispatch.status === 'waiting').map(view),
  };
}
