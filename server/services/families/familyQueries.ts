/** Reading families: lists, one family, the variants of a revision, revision diffs and the audit trail. */
import { and, asc, count, desc, eq, inArray, sql, type SQL } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';
import { revisionDiff } from '../../../shared/families/revisionDiff';
import type { Person } from '../../../shared/schemas/auth';
import type { AuditListResponse, RevisionDiff } from '../../../shared/schemas/review';
import type { VariantListQuery, VariantListResponse, VariantSort } from '../../../shared/schemas/variant';
import type { Family, FamilyListQuery, FamilySummary } from '../../../shared/schemas/family';
import { findTemplate, parseParams } from '../../../templates/index';
import { auditEvents, familyRevisions, familyVariants, type FamilyRevisionRow } from '../../db/schema';
import { notFound } from '../../http/HttpError';
import { acknowledgementsOf, actorsById, familySummaries, toVariantAcknowledged } from '../familyView';
import { familySubject, loadFamily, viewFamily, type FamilyContext } from './loadFamily';

/**
 * The id of a family's current revision (progress events are per revision).
 * @param ctx - app context
 * @param id - family id
 * @throws 404 when there is no such family
 */
export async function currentRevisionId(ctx: FamilyContext, id: string): Promise<string> {
  return (await loadFamily(ctx.db, id)).current.id;
}

/**
 * Families as list rows.
 * @param ctx - app context
 * @param query - state filter and search text
 */
export async function listFamilies(ctx: FamilyContext, query: FamilyListQuery): Promise<FamilySummary[]> {
  const q = query.q?.toLowerCase();
  return (await familySummaries(ctx.db)).filter(
    (family) =>
      (!query.state || family.state === query.state) &&
      (!q || family.name.toLowerCase().includes(q) || family.code.toLowerCase().includes(q)),
  );
}

/**
 * One family. @param ctx - app context @param id - family id @param person - the signed-in person
 * @throws 404 when there is no such family
 */
export function getFamily(ctx: FamilyContext, id: string, person: Person): Promise<Family> {
  return viewFamily(ctx, id, person);
}

/**
 * The sort key of each variant-table column as SQL. Missing figures sort after every value ascending and before
 * every value descending (PostgreSQL's default null order); SKUs compare byte by byte (collation "C").
 */
const VARIANT_SORT_SQL: Record<VariantSort, SQL | AnyPgColumn> = {
  index: familyVariants.index,
  sku: sql`${familyVariants.sku} collate "C"`,
  verdict: sql`case ${familyVariants.verdict} when 'fail' then 0 when 'warn' then 1 when 'pass' then 2 else 3 end`,
  costCents: sql`(${familyVariants.cost} ->> 'costCents')::double precision`,
  supportVolumeMm3: sql`(${familyVariants.report} ->> 'supportVolumeMm3')::double precision`,
  printTimeMin: sql`(${familyVariants.report} ->> 'printTimeMin')::double precision`,
};

/**
 * The variants of a revision, filtered, sorted and paged in the database (ties keep matrix order, in the direction
 * asked).
 * @param ctx - app context
 * @param id - family id
 * @param query - revision, filters, sort and page
 */
export async function listVariants(
  ctx: FamilyContext,
  id: string,
  query: VariantListQuery,
): Promise<VariantListResponse> {
  const { family } = await loadFamily(ctx.db, id);
  const number = query.revision ?? family.currentRevision;
  const [revision] = await ctx.db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), eq(familyRevisions.number, number)));
  if (!revision) throw notFound(`revision: family has no revision ${number}`);
  const where = and(
    eq(familyVariants.revisionId, revision.id),
    query.verdict ? eq(familyVariants.verdict, query.verdict) : undefined,
    query.q ? sql`strpos(lower(${familyVariants.sku}), lower(${query.q})) > 0` : undefined,
  );
  const order = query.dir === 'desc' ? desc : asc;
  const rows = await ctx.db
    .select()
    .from(familyVariants)
    .where(where)
    .orderBy(order(VARIANT_SORT_SQL[query.sort]), order(familyVariants.index))
    .limit(query.pageSize)
    .offset((query.page - 1) * query.pageSize);
  const [{ total }] = await ctx.db.select({ total: count() }).from(familyVariants).where(where);
  // Reasons say which warnings are acknowledged already (the stored verdicts predate the acknowledgements).
  const acknowledged = new Set((await acknowledgementsOf(ctx.db, revision.id)).map((ack) => ack.code));
  return {
    variants: rows.map((row) => toVariantAcknowledged(row, acknowledged)),
    total,
    page: query.page,
    pageSize: query.pageSize,
    revision: number,
  };
}

/**
 * The parameter and axis changes between two revisions of a family.
 * @param ctx - app context
 * @param id - family id
 * @param from - older revision number
 * @param to - newer revision number
 */
export async function diffRevisions(ctx: FamilyContext, id: string, from: number, to: number): Promise<RevisionDiff> {
  await loadFamily(ctx.db, id);
  const rows = await ctx.db
    .select()
    .from(familyRevisions)
    .where(and(eq(familyRevisions.familyId, id), inArray(familyRevisions.number, [from, to])));
  const a = rows.find((row) => row.number === from);
  const b = rows.find((row) => row.number === to);
  if (!a) throw notFound(`from: family has no revision ${from}`);
  if (!b) throw notFound(`to: family has no revision ${to}`);
  // Compare complete parameters: a key one revision leaves at the template default and the other sets to that same
  // default is not a change.
  const complete = (revision: FamilyRevisionRow) => {
    const template = findTemplate(revision.templateId);
    if (!template) return revision;
    try {
      return { ...revision, baseParams: parseParams(template, revision.baseParams) };
    } catch {
      return revision;
    }
  };
  return revisionDiff(complete(a), complete(b));
}

/**
 * The audit log of a family, newest first.
 * @param ctx - app context
 * @param id - family id
 */
export async function familyAudit(ctx: FamilyContext, id: string): Promise<AuditListResponse> {
  await loadFamily(ctx.db, id);
  const rows = await ctx.db
    .select()
    .from(auditEvents)
    .where(eq(auditEvents.subject, familySubject(id)))
    .orderBy(desc(auditEvents.id));
  const names = await actorsById(
    ctx.db,
    rows.map((row) => row.actorId),
  );
  return {
    events: rows.map((row) => ({
      id: row.id,
      action: row.action,
      actor: row.actorId ? (names.get(row.actorId) ?? { id: row.actorId, name: 'someone' }) : null,
      at: row.at.toISOString(),
      details: row.details,
    })),
  };
}
