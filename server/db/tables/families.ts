/**
 * Tables of variant families (revisions, variants, acknowledgements, photos). Re-exported from ../schema.ts.
 */
import {
  doublePrecision,
  index,
  integer,
  jsonb,
  pgTable,
  serial,
  text,
  timestamp,
  uniqueIndex,
} from 'drizzle-orm/pg-core';
import type { Axis, AxisValue, FamilyState, VariantAttributes } from '../../../shared/schemas/familySpec';
import type { PrintRecipe, ProductionTargets } from '../../../shared/schemas/wallRecipe';
import type { ComputeState, VariantCost, VariantReport, VariantVerdict } from '../../../shared/schemas/variant';
import type { ReviewComment } from '../../../shared/schemas/review';
import type { GateWarningCode } from '../../../shared/schemas/gate';
import type { BirdFitWarning, Region } from '../../../shared/schemas/birdfit';
import { newId } from '../newId';
import { people } from './people';

/** A product family: its SKU code and which revisions are current and published. */
export const families = pgTable('families', {
  id: text('id').primaryKey().$defaultFn(newId),
  /** Short code inside every SKU, unique. */
  code: text('code').notNull().unique(),
  ownerId: text('owner_id')
    .notNull()
    .references(() => people.id),
  /** Number of the newest revision. */
  currentRevision: integer('current_revision').notNull().default(1),
  /** Number of the revision in the catalogue, or null. */
  publishedRevision: integer('published_revision'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** One revision of a family: its content, review state and computation status. */
export const familyRevisions = pgTable(
  'family_revisions',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    familyId: text('family_id')
      .notNull()
      .references(() => families.id, { onDelete: 'cascade' }),
    number: integer('number').notNull(),
    state: text('state').$type<FamilyState>().notNull().default('draft'),
    /** Optimistic lock: bumped on every change so concurrent actions on a stale view lose with 409. */
    lock: integer('lock').notNull().default(0),
    name: text('name').notNull(),
    description: text('description').notNull().default(''),
    templateId: text('template_id').notNull(),
    templateVersion: integer('template_version').notNull(),
    baseParams: jsonb('base_params').$type<Record<string, AxisValue>>().notNull(),
    axes: jsonb('axes').$type<Axis[]>().notNull(),
    supportBudgetMm3: doublePrecision('support_budget_mm3').notNull(),
    printerId: text('printer_id').notNull(),
    materialId: text('material_id').notNull(),
    region: text('region').$type<Region>(),
    /** Unit cost, print hours, mass and insulation targets (shared/schemas/wallRecipe.ts). */
    targets: jsonb('targets')
      .$type<ProductionTargets>()
      .notNull()
      .default({ maxUnitCostCents: null, maxPrintHours: null, maxMassG: null, minInsulation: null }),
    /** The family's own perimeters and infill (nulls: the studio's print settings). */
    printRecipe: jsonb('print_recipe').$type<PrintRecipe>().notNull().default({ perimeters: null, infillPct: null }),
    computeState: text('compute_state').$type<ComputeState>().notNull().default('idle'),
    computeDone: integer('compute_done').notNull().default(0),
    computeTotal: integer('compute_total').notNull().default(0),
    computeStartedAt: timestamp('compute_started_at', { withTimezone: true }),
    computeFinishedAt: timestamp('compute_finished_at', { withTimezone: true }),
    computeError: text('compute_error'),
    comments: jsonb('comments').$type<ReviewComment[]>().notNull().default([]),
    createdBy: text('created_by').references(() => people.id, { onDelete: 'set null' }),
    submittedAt: timestamp('submitted_at', { withTimezone: true }),
    approvedAt: timestamp('approved_at', { withTimezone: true }),
    publishedAt: timestamp('published_at', { withTimezone: true }),
    retiredAt: timestamp('retired_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('family_revisions_family_number_idx').on(table.familyId, table.number),
    index('family_revisions_state_idx').on(table.state),
  ],
);

/** One variant of a revision: its SKU, parameters, attributes and, once computed, its mesh hash, report and cost. */
export const familyVariants = pgTable(
  'family_variants',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    revisionId: text('revision_id')
      .notNull()
      .references(() => familyRevisions.id, { onDelete: 'cascade' }),
    index: integer('index').notNull(),
    sku: text('sku').notNull(),
    variantKey: text('variant_key').notNull(),
    axisValues: jsonb('axis_values').$type<Record<string, AxisValue>>().notNull(),
    params: jsonb('params').$type<Record<string, AxisValue>>().notNull(),
    attributes: jsonb('attributes').$type<VariantAttributes>().notNull(),
    status: text('status').$type<'pending' | 'done' | 'failed'>().notNull().default('pending'),
    sha256: text('sha256'),
    report: jsonb('report').$type<VariantReport>(),
    cost: jsonb('cost').$type<VariantCost>(),
    verdict: text('verdict').$type<VariantVerdict>(),
    reasons: jsonb('reasons').$type<string[]>().notNull().default([]),
    birdFitWarnings: jsonb('bird_fit_warnings').$type<BirdFitWarning[]>().notNull().default([]),
    error: text('error'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    uniqueIndex('family_variants_revision_sku_idx').on(table.revisionId, table.sku),
    index('family_variants_sku_idx').on(table.sku),
  ],
);

/** A designer's written acknowledgement of one bird-fit warning code for one revision. */
export const familyAcknowledgements = pgTable(
  'family_acknowledgements',
  {
    id: serial('id').primaryKey(),
    revisionId: text('revision_id')
      .notNull()
      .references(() => familyRevisions.id, { onDelete: 'cascade' }),
    code: text('code').$type<GateWarningCode>().notNull(),
    text: text('text').notNull(),
    personId: text('person_id')
      .notNull()
      .references(() => people.id),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('family_acknowledgements_revision_code_idx').on(table.revisionId, table.code)],
);

/** A photo of a printed sample: two files under DATA_DIR/uploads with random names. */
export const familyPhotos = pgTable(
  'family_photos',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    familyId: text('family_id')
      .notNull()
      .references(() => families.id, { onDelete: 'cascade' }),
    caption: text('caption').notNull().default(''),
    widthPx: integer('width_px').notNull(),
    heightPx: integer('height_px').notNull(),
    originalType: text('original_type').notNull(),
    /** File name (random) of the normalised copy inside the uploads folder. */
    fileName: text('file_name').notNull(),
    /** File name (random) of the thumbnail inside the uploads folder. */
    thumbFileName: text('thumb_file_name').notNull(),
    uploadedBy: text('uploaded_by')
      .notNull()
      .references(() => people.id),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [index('family_photos_family_idx').on(table.familyId)],
);

/** A family row. */
export type FamilyRow = typeof families.$inferSelect;
/** A family revision row. */
export type FamilyRevisionRow = typeof familyRevisions.$inferSelect;
/** A variant row. */
export type FamilyVariantRow = typeof familyVariants.$inferSelect;
/** A photo row. */
export type FamilyPhotoRow = typeof familyPhotos.$inferSelect;
