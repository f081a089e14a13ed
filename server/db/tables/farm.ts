/**
 * Tables of print-farm fulfilment: the dispatch outbox (one row per work order we send or mean to send), the farm's
 * notices kept by id (a repeated notice applies once), print files by mesh hash, and planned runs.
 */
import { sql } from 'drizzle-orm';
import { check, index, integer, jsonb, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import type { HoldCode, WorkOrderStage } from '../../../shared/schemas/farm';
import type { PlanItem, RunPlan } from '../../../shared/schemas/plan';
import type { DispatchStatus } from '../../../shared/schemas/fulfilment';
import { orders } from './orders';

/**
 * One work order for the farm, written as `queued` in the same transaction that marks an order paid (the outbox);
 * the dispatcher sends it with `idempotencyKey`, so a crash between sending and recording never doubles it.
 * A re-dispatch (after an address fix) is a new row with the next `attempt` and its own key.
 */
export const farmDispatches = pgTable(
  'farm_dispatches',
  {
    id: serial('id').primaryKey(),
    /** The customer order, or null for a planned run. */
    orderId: text('order_id').references(() => orders.id, { onDelete: 'cascade' }),
    runId: text('run_id').references(() => farmRuns.id, { onDelete: 'cascade' }),
    attempt: integer('attempt').notNull().default(1),
    idempotencyKey: text('idempotency_key').notNull(),
    status: text('status').$type<DispatchStatus>().notNull().default('queued'),
    /** Send tries that failed because the farm could not be reached. */
    failures: integer('failures').notNull().default(0),
    lastError: text('last_error'),
    nextAttemptAt: timestamp('next_attempt_at', { withTimezone: true }).notNull().defaultNow(),
    farmWorkOrderId: text('farm_work_order_id'),
    farmStage: text('farm_stage').$type<WorkOrderStage>(),
    holdCode: text('hold_code').$type<HoldCode>(),
    holdMessage: text('hold_message'),
    carrier: text('carrier'),
    trackingCode: text('tracking_code'),
    trackingUrl: text('tracking_url'),
    /** Plates the farm reported failed and printed again. */
    reprints: integer('reprints').notNull().default(0),
    /** The same, by line (SKU). */
    reprintsBySku: jsonb('reprints_by_sku').$type<Record<string, number>>().notNull().default({}),
    /** When we last learnt something new about the work order (reconciliation asks about quiet ones). */
    farmCheckedAt: timestamp('farm_checked_at', { withTimezone: true }),
    farmChangedAt: timestamp('farm_changed_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('farm_dispatches_key_idx').on(table.idempotencyKey),
    uniqueIndex('farm_dispatches_work_order_idx').on(table.farmWorkOrderId),
    index('farm_dispatches_order_idx').on(table.orderId),
    index('farm_dispatches_status_idx').on(table.status),
    check(
      'farm_dispatches_status_known',
      sql`${table.status} in ('queued','waiting','at_farm','held','done','withdrawn')`,
    ),
    check('farm_dispatches_one_subject', sql`(${table.orderId} is null) <> (${table.runId} is null)`),
  ],
);

/** Every notice the farm sent, by its id: a repeated delivery finds its row and changes nothing. */
export const farmNotices = pgTable('farm_notices', {
  noticeId: text('notice_id').primaryKey(),
  workOrderId: text('work_order_id').notNull(),
  kind: text('kind').notNull(),
  /** What applying it did, e.g. `applied`, `unknown work order`. */
  outcome: text('outcome').notNull(),
  payload: jsonb('payload').$type<Record<string, unknown>>().notNull(),
  receivedAt: timestamp('received_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * A print file built from a published variant's mesh, by mesh hash: the part sizes the run planner packs, and when
 * the file reached the farm (it is uploaded once).
 */
export const farmPrintFiles = pgTable('farm_print_files', {
  meshSha256: text('mesh_sha256').primaryKey(),
  format: text('format').$type<'stl' | '3mf'>().notNull(),
  bytes: integer('bytes').notNull(),
  /** Bounding-box size [x, y, z] of each part in build orientation. */
  partSizesMm: jsonb('part_sizes_mm').$type<Array<[number, number, number]>>().notNull(),
  uploadedAt: timestamp('uploaded_at', { withTimezone: true }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A planned run sent to the farm as one work order (delivered to the studio). */
export const farmRuns = pgTable('farm_runs', {
  id: text('id').primaryKey(),
  /** e.g. `RUN-2026-03-02-1`. */
  name: text('name').notNull().unique(),
  items: jsonb('items').$type<PlanItem[]>().notNull(),
  plan: jsonb('plan').$type<RunPlan>().notNull(),
  createdBy: text('created_by'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A dispatch row as stored. */
export type FarmDispatchRow = typeof farmDispatches.$inferSelect;
