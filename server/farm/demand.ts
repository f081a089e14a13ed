/**
 * Demand: paid units per variant per ISO week, and what one unit costs printed on demand against printed in a
 * planned run of that demand (the run planner over the same variants), with reprints the farm reported counted in.
 */
import { and, gte, inArray, isNotNull, sql } from 'drizzle-orm';
import { planRun } from '../../shared/planning/planRun';
import type { DemandResponse, DemandVariant } from '../../shared/schemas/fulfilment';
import type { PlanItem } from '../../shared/schemas/plan';
import type { AppContext } from '../context';
import { farmDispatches, orderLines, orders } from '../db/schema';
import { listCatalogueVariants } from '../services/catalogue';
import { loadProductionCatalogue } from '../services/productionCatalogue';
import { planItemOf } from './runPlans';
import { isoDay } from '../../shared/format';

const PAID_STATES = ['paid', 'in_production', 'shipped', 'delivered'] as const;
const DAY_MS = 86_400_000;

/**
 * ISO 8601 week of a date, e.g. `2026-W09` (weeks start on Monday; week 1 holds the year's first Thursday).
 * @param date - the day
 */
export function isoWeek(date: Date): string {
  const d = new Date(Date.UTC(date.getUTCFullYear(), date.getUTCMonth(), date.getUTCDate()));
  const weekday = d.getUTCDay() || 7;
  d.setUTCDate(d.getUTCDate() + 4 - weekday);
  const yearStart = Date.UTC(d.getUTCFullYear(), 0, 1);
  const week = Math.ceil(((d.getTime() - yearStart) / DAY_MS + 1) / 7);
  return `${d.getUTCFullYear()}-W${String(week).padStart(2, '0')}`;
}

/**
 * Demand over the last `weeks` ISO weeks (this one included).
 * @param ctx - app context
 * @param weeks - how many weeks
 * @param now - today
 */
export async function demandReport(ctx: AppContext, weeks: number, now = new Date()): Promise<DemandResponse> {
  const monday = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate()));
  monday.setUTCDate(monday.getUTCDate() - ((monday.getUTCDay() || 7) - 1));
  const start = new Date(monday.getTime() - (weeks - 1) * 7 * DAY_MS);
  const weekLabels = Array.from({ length: weeks }, (_, i) => isoWeek(new Date(start.getTime() + i * 7 * DAY_MS)));

  const rows = await ctx.db
    .select({
      sku: orderLines.sku,
      name: orderLines.productName,
      paidAt: orders.paidAt,
      quantity: orderLines.quantity,
      orderId: orders.id,
    })
    .from(orderLines)
    .innerJoin(orders, sql`${orders.id} = ${orderLines.orderId}`)
    .where(and(isNotNull(orders.paidAt), gte(orders.paidAt, start), inArray(orders.state, [...PAID_STATES])));
  const bySku = new Map<string, { name: string; weeks: Map<string, number>; total: number }>();
  for (const row of rows) {
    const entry = bySku.get(row.sku) ?? { name: row.name, weeks: new Map(), total: 0 };
    const week = isoWeek(row.paidAt!);
    entry.weeks.set(week, (entry.weeks.get(week) ?? 0) + row.quantity);
    entry.total += row.quantity;
    bySku.set(row.sku, entry);
  }

  const orderIds = [...new Set(rows.map((row) => row.orderId))];
  const reprints = new Map<string, number>();
  if (orderIds.length > 0)
    for (const d of await ctx.db
      .select({ bySku: farmDispatches.reprintsBySku })
      .from(farmDispatches)
      .where(inArray(farmDispatches.orderId, orderIds)))
      for (const [sku, n] of Object.entries(d.bySku)) reprints.set(sku, (reprints.get(sku) ?? 0) + n);

  const notes: string[] = [];
  const production = await loadProductionCatalogue(ctx.db);
  const variants = bySku.size ? await listCatalogueVariants(ctx, { skus: [...bySku.keys()] }) : [];
  const items: PlanItem[] = [];
  for (const variant of variants)
    items.push(await planItemOf(ctx, variant, Math.max(1, bySku.get(variant.sku)!.total)));
  const gone = [...bySku.keys()].filter((sku) => !variants.some((v) => v.sku === sku));
  if (gone.length) notes.push(`No cost figures for ${gone.join(', ')}: no longer published.`);

  const costs = new Map<string, { onDemand: number; run: number }>();
  const printer = production.printers.find((p) => p.id === variants[0]?.report.printerId) ?? production.printers[0];
  if (items.length > 0 && printer) {
    const today = isoDay(now);
    const plan = planRun(items, {
      buildVolumeMm: [printer.buildVolumeMm.x, printer.buildVolumeMm.y, printer.buildVolumeMm.z],
      plateWarmUpMin: printer.plateWarmUpMin,
      machineRateCentsPerHour: printer.machineRateCentsPerHour,
      averagePowerW: printer.averagePowerW,
      electricityCentsPerKwh: production.rates.electricityCentsPerKwh,
      labourCentsPerHour: production.rates.labourCentsPerHour,
      failureRatePct: production.rates.failureAllowancePct,
      hoursPerDay: 22,
      startDate: today,
      finishBy: isoDay(now.getTime() + 28 * DAY_MS),
      currency: production.rates.currency,
    });
    for (const line of plan.lines) costs.set(line.sku, { onDemand: line.onDemandUnitCents, run: line.runUnitCents });
    notes.push(
      `Run cost: all the period's units of these variants in one run on the ${printer.name}, plates shared by ` +
        `colour. On demand: one unit per plate and per job; reprints the farm reported are added at their material, ` +
        `machine and energy cost.`,
    );
  }

  const result: DemandVariant[] = [...bySku.entries()].map(([sku, entry]) => {
    const variant = variants.find((v) => v.sku === sku);
    const perUnit = entry.total > 0 ? (reprints.get(sku) ?? 0) / entry.total : 0;
    const b = variant?.cost.breakdown;
    const reprintCents = b ? perUnit * (b.materialCents + b.machineTimeCents + b.energyCents) : 0;
    const cost = costs.get(sku);
    return {
      sku,
      label: items.find((item) => item.sku === sku)?.label ?? entry.name,
      colourId: variant?.attributes.colour ?? 'natural',
      weeks: weekLabels.map((week) => ({ week, units: entry.weeks.get(week) ?? 0 })),
      totalUnits: entry.total,
      onDemandUnitCents: cost ? Math.round(cost.onDemand + reprintCents) : null,
      runUnitCents: cost ? cost.run : null,
      reprintsPerUnit: perUnit,
    };
  });
  result.sort((a, b) => b.totalUnits - a.totalUnits || a.sku.localeCompare(b.sku));
  return { weeks: weekLabels, variants: result, currency: production.rates.currency, notes };
}
