/**
 * Run plans from the catalogue: turns chosen SKUs and quantities into planner items (the engine's per-part sizes,
 * print time, mass and unit cost of each published variant), plans the run on a printer of the production catalogue,
 * and sends a plan to the farm as one run work order (through the dispatch outbox).
 */
import { count, desc, inArray, sql } from 'drizzle-orm';
import { planRun } from '../../shared/planning/planRun';
import type { CatalogueVariant } from '../../shared/schemas/catalogue';
import type { FarmRun, PlanRequest, PlanResponse } from '../../shared/schemas/fulfilment';
import type { PlanItem } from '../../shared/schemas/plan';
import type { AppContext } from '../context';
import { farmDispatches, farmRuns } from '../db/schema';
import { fieldProblem } from '../http/HttpError';
import { recordAudit } from '../services/audit';
import { listCatalogueVariants } from '../services/catalogue';
import { loadProductionCatalogue } from '../services/productionCatalogue';
import { dispatchKey } from './dispatchOrders';
import { toDispatch } from './farmViews';
import { partSizesOf } from './printFiles';
import { isoDay } from '../../shared/format';

/** Labour to clear a plate and start the next (common practice, no source). */
const PLATE_CHANGE_MIN = 5;
/** Labour to prepare and send one print job (common practice, no source). */
const JOB_SETUP_MIN = 10;

/**
 * A planner item for a published variant: part sizes from the report when the engine stored them, else from the
 * measured print file (built once from the pinned mesh).
 * @param ctx - app context
 * @param variant - the published variant
 * @param quantity - units wanted
 */
export async function planItemOf(ctx: AppContext, variant: CatalogueVariant, quantity: number): Promise<PlanItem> {
  const stored = variant.report.partSizesMm;
  const partSizesMm = stored?.length
    ? stored
    : variant.sha256
      ? await partSizesOf(ctx.db, ctx.files, variant.sha256, variant.sku)
      : [variant.report.bboxSizeMm];
  const axes = Object.values(variant.axisValues).map(String).join(', ');
  return {
    sku: variant.sku,
    meshSha256: variant.sha256 ?? undefined,
    label: axes ? `${variant.family.name} (${axes})` : variant.family.name,
    materialId: variant.attributes.material,
    colourId: variant.attributes.colour ?? 'natural',
    quantity,
    partSizesMm,
    unitPrintTimeMin: Math.max(0.1, variant.report.printTimeMin),
    unitMassG: variant.report.massG,
    unitFilamentLengthM: variant.report.filamentLengthM,
    unitCostCents: variant.cost.costCents,
  };
}

/**
 * Plans a run for the request.
 * @param ctx - app context
 * @param request - SKUs and quantities, printer, dates, hours per day
 * @throws 400 naming an unknown SKU, printer, or dates in the wrong order
 */
export async function planFromCatalogue(ctx: AppContext, request: PlanRequest): Promise<PlanResponse> {
  if (request.finishBy <= request.startDate)
    throw fieldProblem('finishBy', 'The finish date must be after the start date.');
  const production = await loadProductionCatalogue(ctx.db);
  const printer = production.printers.find((p) => p.id === request.printerId);
  if (!printer) throw fieldProblem('printerId', 'That printer is not in the studio’s printer list: choose another.');
  const skus = [...new Set(request.items.map((item) => item.sku))];
  const variants = await listCatalogueVariants(ctx, { skus });
  const bySku = new Map(variants.map((v) => [v.sku, v]));
  const unknown = skus.find((sku) => !bySku.has(sku));
  if (unknown) throw fieldProblem('items', `${unknown} is not a published variant.`);
  const quantities = new Map<string, number>();
  for (const item of request.items) quantities.set(item.sku, (quantities.get(item.sku) ?? 0) + item.quantity);
  const items: PlanItem[] = [];
  for (const sku of skus) items.push(await planItemOf(ctx, bySku.get(sku)!, quantities.get(sku)!));
  const volume: [number, number, number] = [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z];
  let plan;
  try {
    plan = planRun(items, {
      buildVolumeMm: volume,
      plateWarmUpMin: printer.plateWarmUpMin,
      plateChangeMin: PLATE_CHANGE_MIN,
      jobSetupMin: JOB_SETUP_MIN,
      machineRateCentsPerHour: printer.machineRateCentsPerHour,
      averagePowerW: printer.averagePowerW,
      electricityCentsPerKwh: production.rates.electricityCentsPerKwh,
      labourCentsPerHour: production.rates.labourCentsPerHour,
      failureRatePct: production.rates.failureAllowancePct,
      hoursPerDay: request.hoursPerDay,
      startDate: request.startDate,
      finishBy: request.finishBy,
      currency: production.rates.currency,
    });
  } catch (err) {
    if (err instanceof RangeError)
      throw fieldProblem(
        'printerId',
        `${err.message.charAt(0).toUpperCase()}${err.message.slice(1)} on the ${printer.name}.`,
      );
    throw err;
  }
  return { plan, items, printer: { id: printer.id, name: printer.name, buildVolumeMm: volume } };
}

/**
 * Stores a run and queues its dispatch in one transaction (the dispatcher sends it as one run work order).
 * @param ctx - app context
 * @param request - the plan request (planned again here: nothing from the browser is trusted)
 * @param actorId - who sent it
 */
export async function createRun(ctx: AppContext, request: PlanRequest, actorId: string): Promise<FarmRun> {
  const { plan, items } = await planFromCatalogue(ctx, request);
  const id = crypto.randomUUID();
  return ctx.db.transaction(async (tx) => {
    const [{ today }] = await tx
      .select({ today: count() })
      .from(farmRuns)
      .where(sql`${farmRuns.createdAt}::date = current_date`);
    const name = `RUN-${isoDay()}-${today + 1}`;
    const [run] = await tx.insert(farmRuns).values({ id, name, items, plan, createdBy: actorId }).returning();
    const [dispatch] = await tx
      .insert(farmDispatches)
      .values({ runId: id, attempt: 1, idempotencyKey: dispatchKey(`run:${id}`, 1) })
      .returning();
    await recordAudit(tx, {
      actorId,
      action: 'farm_run.created',
      subject: `farm_run:${id}`,
      details: { name, units: plan.totals.units, plates: plan.plates.length },
    });
    return toRun(run, dispatch);
  });
}

/**
 * Runs, newest first, with their latest dispatch.
 * @param ctx - app context
 */
export async function listRuns(ctx: AppContext): Promise<FarmRun[]> {
  const runs = await ctx.db.select().from(farmRuns).orderBy(desc(farmRuns.createdAt)).limit(100);
  if (runs.length === 0) return [];
  const dispatches = await ctx.db
    .select()
    .from(farmDispatches)
    .where(
      inArray(
        farmDispatches.runId,
        runs.map((run) => run.id),
      ),
    )
    .orderBy(desc(farmDispatches.attempt));
  return runs.map((run) =>
    toRun(
      run,
      dispatches.find((d) => d.runId === run.id),
    ),
  );
}

function toRun(run: typeof farmRuns.$inferSelect, dispatch: typeof farmDispatches.$inferSelect | undefined): FarmRun {
  return {
    id: run.id,
    name: run.name,
    units: run.plan.totals.units,
    plates: run.plan.plates.length,
    createdAt: run.createdAt.toISOString(),
    dispatch: dispatch ? toDispatch(dispatch) : null,
  };
}
