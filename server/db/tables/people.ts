/**
 * Studios and the people who sign in. Every other table module imports `people` from here (never from schema.ts,
 * which re-exports all tables), so the table modules form no import cycle.
 */
import { sql } from 'drizzle-orm';
import { check, pgTable, text, timestamp } from 'drizzle-orm/pg-core';
import type { Role } from '../../../shared/schemas/auth';
import { newId } from '../newId';

/** A studio: the team that owns the designs, families and catalogue. */
export const studios = pgTable('studios', {
  id: text('id').primaryKey().$defaultFn(newId),
  name: text('name').notNull(),
  /** BCP 47 tag money and dates are written in (screens and documents), e.g. `en-GB`. */
  locale: text('locale').notNull().default('en-GB'),
  createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
  updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
});

/**
 * A person who signs in. `roles` holds one or more of ROLES (shared/schemas/auth.ts); the check constraint keeps
 * the database honest if a row is written outside the API.
 */
export const people = pgTable(
  'people',
  {
    id: text('id').primaryKey().$defaultFn(newId),
    email: text('email').notNull().unique(),
    name: text('name').notNull(),
    passwordHash: text('password_hash').notNull(),
    roles: text('roles').array().notNull().$type<Role[]>(),
    studioId: text('studio_id')
      .notNull()
      .references(() => studios.id),
    /** Set when an admin switched the person off: they cannot sign in and hold no session. Null while active. */
    deactivatedAt: timestamp('deactivated_at', { withTimezone: true }),
    createdAt: timestamp('created_at', { withTimezone: true }).notNull().defaultNow(),
    updatedAt: timestamp('updated_at', { withTimezone: true }).notNull().defaultNow(),
  },
  (table) => [
    check(
      'people_roles_known',
      sql`cardinality(${table.roles}) > 0 and ${table.roles} <@ array['designer','catalogue_manager','sales','operations','admin']::text[]`,
    ),
  ],
);

/** A person row as stored. */
export type PersonRow = typeof people.$inferSelect;
