/** Saved quotes: insert, replace, read, list and change state. Figures come from computeQuote (./quote.ts). */
import { asc, desc, eq, inArray } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { quoteStatusOn } from '../../shared/quotes/quoteStatus';
import { todayUtc, type Quote, type QuoteStatus, type QuoteSummary } from '../../shared/schemas/quote';
import type { Db } from '../db/client';
import { people, quoteLines, quotes, type QuoteLineRow, type QuoteRow } from '../db/schema';
import type { QuoteFigures } from './quote';

/** `Q-0007` from the running number. */
function reference(number: number): string {
  return `Q-${String(number).padStart(4, '0')}`;
}

const copiedFromQuote = alias(quotes, 'copied_from_quote');

function toQuote(
  row: QuoteRow,
  lines: QuoteLineRow[],
  createdByName: string,
  copiedFrom: { id: string; number: number } | null,
  today: string,
): Quote {
  return {
    id: row.id,
    reference: reference(row.number),
    status: quoteStatusOn(row.status, row.validUntil, today),
    customerName: row.customerName,
    deliveryDate: row.deliveryDate,
    validUntil: row.validUntil,
    terms: row.terms,
    currency: row.currency,
    lines: lines
      .sort((a, b) => a.position - b.position)
      .map((line) => ({
        sku: line.sku,
        productName: line.productName,
        familyName: line.familyName,
        quantity: line.quantity,
        unitCostCents: line.unitCostCents,
        listPriceCents: line.listPriceCents,
        discountPct: line.discountPct,
        breakPriceCents: line.breakPriceCents,
        unitPriceCents: line.unitPriceCents,
        priceSetByHand: line.priceSetByHand,
        lineTotalCents: line.lineTotalCents,
        marginPct: line.marginPct,
        farm: line.farm,
        breaks: line.breaks,
      })),
    subtotalCents: row.subtotalCents,
    shippingCents: row.shippingCents,
    taxRatePct: row.taxRatePct,
    taxCents: row.taxCents,
    totalCents: row.totalCents,
    costCents: row.costCents,
    marginPct: row.marginPct,
    farm: row.farm,
    earliestDeliveryDate: row.earliestDeliveryDate,
    feasible: row.feasible,
    copiedFrom: copiedFrom ? { id: copiedFrom.id, reference: reference(copiedFrom.number) } : null,
    createdBy: { id: row.createdById, name: createdByName },
    createdAt: row.createdAt.toISOString(),
    updatedAt: row.updatedAt.toISOString(),
  };
}

/** The header columns of computed figures. */
function headerValues(figures: QuoteFigures) {
  const { lines: _lines, ...header } = figures;
  return header;
}

function lineValues(quoteId: string, figures: QuoteFigures) {
  return figures.lines.map((line, position) => ({ ...line, quoteId, position }));
}

/**
 * Saves a computed quote as a draft.
 * @param db - database
 * @param figures - from computeQuote
 * @param person - who made it
 * @param copiedFromId - the quote it was copied from, if any
 */
export async function insertQuote(
  db: Db,
  figures: QuoteFigures,
  person: { id: string },
  copiedFromId: string | null = null,
): Promise<Quote> {
  const id = await db.transaction(async (tx) => {
    const [row] = await tx
      .insert(quotes)
      .values({ ...headerValues(figures), status: 'draft', copiedFromId, createdById: person.id })
      .returning({ id: quotes.id });
    await tx.insert(quoteLines).values(lineValues(row.id, figures));
    return row.id;
  });
  return (await findQuote(db, id))!;
}

/**
 * Replaces the terms and lines of a quote. A sent quote that is changed becomes a draft again: the customer has
 * not seen the new version. The caller checks that the quote may be edited.
 * @param db - database
 * @param id - quote id
 * @param figures - from computeQuote
 */
export async function replaceQuote(db: Db, id: string, figures: QuoteFigures): Promise<Quote> {
  await db.transaction(async (tx) => {
    await tx
      .update(quotes)
      .set({ ...headerValues(figures), status: 'draft', updatedAt: new Date() })
      .where(eq(quotes.id, id));
    await tx.delete(quoteLines).where(eq(quoteLines.quoteId, id));
    await tx.insert(quoteLines).values(lineValues(id, figures));
  });
  return (await findQuote(db, id))!;
}

/**
 * Saves a new state.
 * @param db - database
 * @param id - quote id
 * @param status - the new state (the caller checks the move is allowed)
 */
export async function setQuoteStatus(db: Db, id: string, status: QuoteStatus): Promise<Quote> {
  await db.update(quotes).set({ status, updatedAt: new Date() }).where(eq(quotes.id, id));
  return (await findQuote(db, id))!;
}

/**
 * Every quote, newest first.
 * @param db - database
 */
export async function listQuotes(db: Db): Promise<QuoteSummary[]> {
  const rows = await db
    .select({ quote: quotes, name: people.name })
    .from(quotes)
    .innerJoin(people, eq(people.id, quotes.createdById))
    .orderBy(desc(quotes.createdAt), desc(quotes.number));
  const lines = rows.length
    ? await db
        .select()
        .from(quoteLines)
        .where(
          inArray(
            quoteLines.quoteId,
            rows.map((r) => r.quote.id),
          ),
        )
        .orderBy(asc(quoteLines.position))
    : [];
  const byQuote = new Map<string, QuoteLineRow[]>();
  for (const line of lines) byQuote.set(line.quoteId, [...(byQuote.get(line.quoteId) ?? []), line]);
  const today = todayUtc();
  return rows.map(({ quote, name }) => {
    const own = byQuote.get(quote.id) ?? [];
    return {
      id: quote.id,
      reference: reference(quote.number),
      status: quoteStatusOn(quote.status, quote.validUntil, today),
      customerName: quote.customerName,
      deliveryDate: quote.deliveryDate,
      validUntil: quote.validUntil,
      currency: quote.currency,
      totalCents: quote.totalCents,
      marginPct: quote.marginPct,
      earliestDeliveryDate: quote.earliestDeliveryDate,
      feasible: quote.feasible,
      createdAt: quote.createdAt.toISOString(),
      createdByName: name,
      lineCount: own.length,
      units: own.reduce((sum, line) => sum + line.quantity, 0),
      firstSku: own[0]?.sku ?? '',
    };
  });
}

/**
 * One quote with its lines, or undefined.
 * @param db - database
 * @param id - quote id
 */
export async function findQuote(db: Db, id: string): Promise<Quote | undefined> {
  const [row] = await db
    .select({
      quote: quotes,
      name: people.name,
      copiedFrom: { id: copiedFromQuote.id, number: copiedFromQuote.number },
    })
    .from(quotes)
    .innerJoin(people, eq(people.id, quotes.createdById))
    .leftJoin(copiedFromQuote, eq(copiedFromQuote.id, quotes.copiedFromId))
    .where(eq(quotes.id, id));
  if (!row) return undefined;
  const lines = await db.select().from(quoteLines).where(eq(quoteLines.quoteId, id));
  return toQuote(row.quote, lines, row.name, row.copiedFrom?.id ? row.copiedFrom : null, todayUtc());
}
