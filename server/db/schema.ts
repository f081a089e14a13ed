/**
 * The database schema (drizzle pg-core). Tables are snake_case plural, properties camelCase.
 * After a change run `npm run db:generate` and commit the new migration in drizzle/.
 * This module re-exports every table module; a table module imports the tables it references from their own
 * module (e.g. `people` from ./tables/people), never from here, so that no import cycle forms.
 */
import { index, jsonb, pgTable, serial, text, timestamp, uniqueIndex } from 'drizzle-orm/pg-core';
import type { CostRates, PrintSettings } from '../../shared/schemas/production';
import { newId } from './newId';
import { people } from './tables/people';

export * from './tables/people';

/** Sign-in sessions (lucia). The id is the secret kept in the HttpOnly cookie. */
export const sessions = pgTable(
  'sessions',
  {
    id: text('id').primaryKey(),
    userId: text('user_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    expiresAt: timestamp('expires_at', { withTimezone: true, mode: 'date' }).notNull(),
  },
  (table) => [index('sessions_user_id_idx').on(table.userId)],
);

/** Who did what to which subject, and when (role changes now; reviews and publishing in later issues). */
export const auditEvents = pgTable(
  'audit_events',
  {
    id: serial('id').primaryKey(),
    /** The person who acted; null for the system (seeding, CLI). */
    actorId: text('actor_id').references(() => people.id, { onDelete: 'set null' }),
    /** Dotted verb, e.g. `person.roles_changed`. */
    action: text('action').notNull(),
    /** What was acted on, e.g. `person:<id>`. */
    subject: text('subject').notNull(),
    at: timestamp('at', { withTimezone: true }).notNull().defaultNow(),
    details: jsonb('details').$type<Record<string, unknown>>().notNull().default({}),
  },
  (table) => [index('audit_events_subject_idx').on(table.subject), index('audit_events_at_idx').on(table.at)],
);

/** A designer's saved design: template parameters under a name. */
export const presets = pgTable(
  'presets',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    ownerId: text('owner_id')
      .notNull()
      .references(() => people.id, { onDelete: 'cascade' }),
    templateId: text('template_id').notNull(),
    templateVersion: text('template_version').notNull(),
    name: text('name').notNull(),
    params: jsonb('params').$type<Record<string, unknown>>().notNull(),
    /** A `data:image/png;base64,...` URL, or null when no thumbnail was taken. */
    thumbnailPng: text('thumbnail_png'),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [uniqueIndex('presets_owner_template_name_idx').on(table.ownerId, table.templateId, table.name)],
);

/** A printer profile (build volume, nozzle, speeds...) kept as JSON validated by shared/production. */
export const printerProfiles = pgTable('printer_profiles', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  data: jsonb('data').$type<Record<string, unknown>>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A printing material (density, price, softening temperature...) kept as JSON validated by shared/production. */
export const materials = pgTable('materials', {
  id: text('id').primaryKey(),
  name: text('name').notNull(),
  data: jsonb('data').$type<Record<string, unknown>>().notNull(),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * The studio's print settings and cost rates (one row, id `studio`), validated by shared/schemas/production. The
 * built-in defaults of shared/production seed it; every reader takes them from here.
 */
export const productionSettings = pgTable('production_settings', {
  id: text('id').primaryKey(),
  settings: jsonb('settings').$type<PrintSettings>().notNull(),
  rates: jsonb('rates').$type<CostRates>().notNull(),
  updatedById: text('updated_by_id').references(() => people.id, { onDelete: 'set null' }),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/** The seed steps that ran on this database; empty means the database is new. */
export const seedRuns = pgTable('seed_runs', {
  name: text('name').primaryKey(),
  ranAt: timestamp('ran_at', { withTimezone: true }).notNull().defaultNow(),
});

/** A preset row as stored. */
export type PresetRow = typeof presets.$inferSelect;

export * from './tables/families';
export * from './tables/mail';
export * from './tables/sales';
export * from './tables/jobs';
export * from './tables/orders';
export * from './tables/farm';
