/** The audit log: who did what to which subject. */
import { desc, eq } from 'drizzle-orm';
import type { Db } from '../db/client';
import { auditEvents } from '../db/schema';

/** One event to record. */
export interface AuditEntry {
  /** The person acting; null for the system (seeding, CLI). */
  actorId: string | null;
  /** Dotted verb, e.g. `person.roles_changed`. */
  action: string;
  /** What was acted on, e.g. `person:<id>`. */
  subject: string;
  details?: Record<string, unknown>;
}

/**
 * Appends one event to the audit log.
 * @param db - the database (or a transaction)
 * @param entry - what happened
 */
export async function recordAudit(db: Pick<Db, 'insert'>, entry: AuditEntry): Promise<void> {
  await db.insert(auditEvents).values({ ...entry, details: entry.details ?? {} });
}

/**
 * The events about one subject, newest first.
 * @param db - the database
 * @param subject - e.g. `person:<id>`
 */
export function auditEventsFor(db: Db, subject: string) {
  return db.select().from(auditEvents).where(eq(auditEvents.subject, subject)).orderBy(desc(auditEvents.id));
}
