/**
 * The dispatch outbox. Marking an order paid writes its dispatch row in the same transaction (a hook on h9's order
 * transitions); the dispatcher sends due rows to the farm with the row's idempotency key, so a crash anywhere
 * between payment and the farm's answer neither loses nor doubles a work order. A farm that cannot be reached is
 * tried again with growing delays while the order shows "waiting for the farm" and the last error.
 */
import { and, asc, eq, inArray, lte } from 'drizzle-orm';
import type { WorkOrderInput, WorkOrderLineInput } from '../../shared/schemas/farm';
import { formatOrderNumber } from '../../shared/schemas/order';
import type { AppContext } from '../context';
import type { Queryable } from '../db/client';
import { familyVariants, farmDispatches, farmRuns, orderLines, orders, type FarmDispatchRow } from '../db/schema';
import { recordAudit } from '../services/audit';
import { onOrderTransition } from '../services/orderHooks';
import { subjectOf } from '../services/orderQueries';
import { getSalesSettings } from '../services/salesSettings';
import { applyWorkOrder } from './applyWorkOrder';
import { FarmError } from './FarmClient';
import type { FarmRuntime } from './farmRuntime';
import { ensurePrintFile, PinnedMeshError } from './printFiles';

/** Rows sent per round. */
const BATCH = 20;

/**
 * The idempotency key of a dispatch: stable for the row, so every retry of it is the same work order at the farm.
 * @param subject - `order:<id>` or `run:<id>`
 * @param attempt - 1 for the first dispatch, 2 after the first re-dispatch...
 */
export function dispatchKey(subject: string, attempt: number): string {
  return `${subject}:dispatch:${attempt}`;
}

/**
 * Writes the dispatch row of a paid order in the payment's transaction.
 * @param tx - the open transaction
 * @param orderId - the order just paid
 */
export async function queueOrderDispatch(tx: Queryable, orderId: string): Promise<void> {
  // No audit entry here: the order's own `order.paid` entry marks the moment; `farm.dispatched` or `farm.waiting`
  // follow when the dispatcher acts.
  await tx
    .insert(farmDispatches)
    .values({ orderId, attempt: 1, idempotencyKey: dispatchKey(`order:${orderId}`, 1) })
    .onConflictDoNothing();
}

let hookInstalled = false;
const wakers = new Set<() => void>();

/**
 * Installs (once per process) the hook that writes a dispatch row when an order becomes paid, in the payment's
 * transaction; createApp() calls it, so every process that can take a payment writes the outbox.
 */
export function installDispatchHook(): void {
  if (hookInstalled) return;
  hookInstalled = true;
  onOrderTransition(async (event) => {
    if (event.to !== 'paid') return;
    await queueOrderDispatch(event.tx, event.order.id);
    for (const wake of wakers) wake();
  });
}

/**
 * Wakes a running farm's dispatcher after each payment.
 * @param runtime - the farm to wake
 * @returns a function that stops waking it
 */
export function wakeOnPayment(runtime: Pick<FarmRuntime, 'nudge'>): () => void {
  const wake = () => runtime.nudge();
  wakers.add(wake);
  return () => wakers.delete(wake);
}

/**
 * Sends every due dispatch row (queued, or waiting whose next try has come).
 * @param ctx - app context
 * @param runtime - the farm
 * @returns rows sent successfully
 */
export async function dispatchDue(ctx: AppContext, runtime: FarmRuntime): Promise<number> {
  const due = await ctx.db
    .select()
    .from(farmDispatches)
    .where(and(inArray(farmDispatches.status, ['queued', 'waiting']), lte(farmDispatches.nextAttemptAt, new Date())))
    .orderBy(asc(farmDispatches.id))
    .limit(BATCH);
  let sent = 0;
  for (const row of due) if (await dispatchOne(ctx, runtime, row)) sent++;
  return sent;
}

/** Sends one row; records success, a wait or a refusal. */
async function dispatchOne(ctx: AppContext, runtime: FarmRuntime, row: FarmDispatchRow): Promise<boolean> {
  const subject = row.orderId ? subjectOf(row.orderId) : `farm_run:${row.runId}`;
  try {
    const input = await workOrderInput(ctx, row);
    for (const hash of new Set(input.lines.map((line) => line.meshSha256)))
      await ensurePrintFile(
        ctx.db,
        ctx.files,
        runtime.client,
        hash,
        input.lines.find((l) => l.meshSha256 === hash)?.lineRef,
      );
    const workOrder = await runtime.client.createWorkOrder(input, row.idempotencyKey);
    await ctx.db.transaction(async (tx) => {
      const [claimed] = await tx
        .update(farmDispatches)
        .set({
          status: 'at_farm',
          farmWorkOrderId: workOrder.id,
          farmStage: workOrder.stage,
          lastError: null,
          farmChangedAt: new Date(),
          farmCheckedAt: new Date(),
          updatedAt: new Date(),
        })
        .where(and(eq(farmDispatches.id, row.id), inArray(farmDispatches.status, ['queued', 'waiting'])))
        .returning({ id: farmDispatches.id });
      if (claimed)
        await recordAudit(tx, {
          actorId: null,
          action: 'farm.dispatched',
          subject,
          details: { farmWorkOrderId: workOrder.id, attempt: row.attempt, failedTries: row.failures },
        });
    });
    await applyWorkOrder(ctx, workOrder, 'dispatch');
    return true;
  } catch (err) {
    if (err instanceof FarmError && err.retryable) {
      const failures = row.failures + 1;
      const delayMs = retryDelayMs(runtime.env.FARM_RETRY_BASE_MS, failures);
      await ctx.db.transaction(async (tx) => {
        await tx
          .update(farmDispatches)
          .set({
            status: 'waiting',
            failures,
            lastError: err.message,
            nextAttemptAt: new Date(Date.now() + delayMs),
            updatedAt: new Date(),
          })
          .where(eq(farmDispatches.id, row.id));
        if (row.failures === 0)
          await recordAudit(tx, {
            actorId: null,
            action: 'farm.waiting',
            subject,
            details: { error: err.message, attempt: row.attempt },
          });
      });
      return false;
    }
    const message =
      err instanceof FarmError || err instanceof PinnedMeshError
        ? err.message
        : `unexpected: ${err instanceof Error ? err.message : String(err)}`;
    await ctx.db.transaction(async (tx) => {
      await tx
        .update(farmDispatches)
        .set({ status: 'held', holdCode: null, holdMessage: message, lastError: message, updatedAt: new Date() })
        .where(eq(farmDispatches.id, row.id));
      await recordAudit(tx, { actorId: null, action: 'farm.refused', subject, details: { error: message } });
    });
    return false;
  }
}

/**
 * Wait before the n-th retry: base × 2^(n−1), at most 5 minutes, with ±20 % jitter so many orders do not retry in
 * step.
 * @param baseMs - the first wait
 * @param failures - tries failed so far (≥ 1)
 */
export function retryDelayMs(baseMs: number, failures: number): number {
  const plain = Math.min(300_000, baseMs * 2 ** Math.min(20, failures - 1));
  return Math.round(plain * (0.8 + Math.random() * 0.4));
}

/** The work order a dispatch row stands for: the order's lines and address, or the run's items to the workshop. */
async function workOrderInput(ctx: AppContext, row: FarmDispatchRow): Promise<WorkOrderInput> {
  if (row.orderId) {
    const [order] = await ctx.db.select().from(orders).where(eq(orders.id, row.orderId));
    if (!order) throw new PinnedMeshError('the order no longer exists');
    const lines = await ctx.db
      .select()
      .from(orderLines)
      .where(eq(orderLines.orderId, row.orderId))
      .orderBy(asc(orderLines.position));
    const attrs = await variantAttributes(
      ctx,
      lines.map((line) => line.meshSha256),
    );
    return {
      reference: formatOrderNumber(order.number),
      kind: 'single',
      lines: lines.map((line): WorkOrderLineInput => {
        const a = attrs.get(`${line.sku}\u0000${line.meshSha256}`);
        if (!a) throw new PinnedMeshError(`no published variant ${line.sku} with the mesh that was sold`);
        return {
          lineRef: line.sku,
          meshSha256: line.meshSha256,
          material: a.material,
          colour: a.colour,
          quantity: line.quantity,
        };
      }),
      shipTo: order.shipTo,
    };
  }
  const [run] = await ctx.db
    .select()
    .from(farmRuns)
    .where(eq(farmRuns.id, row.runId ?? ''));
  if (!run) throw new PinnedMeshError('the run no longer exists');
  const hashes = await ctx.db
    .select({ sku: familyVariants.sku, sha256: familyVariants.sha256 })
    .from(familyVariants)
    .where(
      inArray(
        familyVariants.sku,
        run.items.map((item) => item.sku),
      ),
    );
  return {
    reference: run.name,
    kind: 'run',
    lines: run.items.map((item) => {
      const hash = hashes.find((h) => h.sku === item.sku && h.sha256 === item.meshSha256)?.sha256;
      if (!hash) throw new PinnedMeshError(`no variant ${item.sku} with the planned mesh`);
      return {
        lineRef: item.sku,
        meshSha256: hash,
        material: item.materialId,
        colour: item.colourId,
        quantity: item.quantity,
      };
    }),
    // Runs go to the studio's own workshop, as the sales settings give it.
    shipTo: (await getSalesSettings(ctx.db)).settings.workshopAddress,
  };
}

/** Material and colour of the variants with these mesh hashes, by SKU and hash. */
async function variantAttributes(
  ctx: AppContext,
  hashes: string[],
): Promise<Map<string, { material: string; colour: string }>> {
  if (hashes.length === 0) return new Map();
  const rows = await ctx.db
    .select({ sku: familyVariants.sku, sha256: familyVariants.sha256, attributes: familyVariants.attributes })
    .from(familyVariants)
    .where(inArray(familyVariants.sha256, hashes));
  return new Map(
    rows.map((row) => [
      `${row.sku}\u0000${row.sha256}`,
      { material: row.attributes.material, colour: row.attributes.colour ?? 'natural' },
    ]),
  );
}
