/** The home page's to-do counts: one small count query per item, run only for the roles the person holds. */
import { and, count, eq, gte, inArray, sql } from 'drizzle-orm';
import type { Person, Role } from '../../shared/schemas/auth';
import type { TodoItem } from '../../shared/schemas/todo';
import type { Db } from '../db/client';
import { families, familyRevisions, farmDispatches, mailOutbox, orders, quotes } from '../db/schema';

/** The count of a query built with `count()`. */
async function counted(rows: Promise<Array<{ n: number }>>): Promise<number> {
  return Number((await rows)[0]?.n ?? 0);
}

/** A family's current revision joined to the family (the revision people work on). */
function currentRevisions(db: Db) {
  return db
    .select({ n: count() })
    .from(families)
    .innerJoin(
      familyRevisions,
      and(eq(familyRevisions.familyId, families.id), eq(familyRevisions.number, families.currentRevision)),
    );
}

/** The items of one role, in the order the home page shows them. */
const ITEMS: Record<Role, (db: Db, person: Person, today: string) => Promise<TodoItem[]>> = {
  async designer(db, person) {
    // A family is "sent back" while its draft's newest review comment is a return.
    const sentBack = sql<boolean>`coalesce(${familyRevisions.comments} -> -1 ->> 'action', '') = 'return'`;
    const mine = and(eq(families.ownerId, person.id), eq(familyRevisions.state, 'draft'));
    const [returned, drafts] = await Promise.all([
      counted(currentRevisions(db).where(and(mine, sentBack))),
      counted(currentRevisions(db).where(mine)),
    ]);
    return [
      {
        key: 'designer.sent_back',
        role: 'designer',
        label: 'Families sent back to you',
        count: returned,
        path: '/families',
      },
      { key: 'designer.drafts', role: 'designer', label: 'Your families in draft', count: drafts, path: '/families' },
    ];
  },
  async catalogue_manager(db) {
    const waiting = await counted(currentRevisions(db).where(eq(familyRevisions.state, 'in_review')));
    return [
      {
        key: 'catalogue_manager.in_review',
        role: 'catalogue_manager',
        label: 'Families waiting for your review',
        count: waiting,
        path: '/review',
      },
    ];
  },
  async sales(db, _person, today) {
    // Drafts and sent quotes still within their validity date: the ones a sales person follows up.
    const open = await counted(
      db
        .select({ n: count() })
        .from(quotes)
        .where(and(inArray(quotes.status, ['draft', 'sent']), gte(quotes.validUntil, today))),
    );
    return [
      {
        key: 'sales.open_quotes',
        role: 'sales',
        label: 'Open quotes (draft or sent, still valid)',
        count: open,
        path: '/quotes',
      },
    ];
  },
  async operations(db) {
    const [toSend, exceptions] = await Promise.all([
      counted(
        db
          .select({ n: count() })
          .from(orders)
          .where(inArray(orders.state, ['paid', 'in_production'])),
      ),
      counted(
        db
          .select({ n: count() })
          .from(farmDispatches)
          .where(inArray(farmDispatches.status, ['held', 'waiting'])),
      ),
    ]);
    return [
      { key: 'operations.to_send', role: 'operations', label: 'Paid orders to send', count: toSend, path: '/orders' },
      {
        key: 'operations.exceptions',
        role: 'operations',
        label: 'Farm exceptions to resolve',
        count: exceptions,
        path: '/farm/exceptions',
      },
    ];
  },
  async admin(db) {
    const failed = await counted(db.select({ n: count() }).from(mailOutbox).where(eq(mailOutbox.status, 'failed')));
    return [
      { key: 'admin.failed_mail', role: 'admin', label: 'E-mails that failed', count: failed, path: '/admin/mail' },
    ];
  },
};

/**
 * What waits for this person: the to-do counts of every role they hold, in role order.
 * @param db - database
 * @param person - the signed-in person
 * @param today - today's date (YYYY-MM-DD) for "delivery still ahead"
 */
export async function todoCounts(db: Db, person: Person, today: string): Promise<TodoItem[]> {
  const roles = (Object.keys(ITEMS) as Role[]).filter((role) => person.roles.includes(role));
  return (await Promise.all(roles.map((role) => ITEMS[role](db, person, today)))).flat();
}
