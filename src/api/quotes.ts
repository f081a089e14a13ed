import {
  QuoteListResponseSchema,
  QuoteSchema,
  type Quote,
  type QuoteCreate,
  type QuoteSummary,
} from '../../shared/schemas/quote';
import { api } from './client';

/** Every saved quote, newest first. */
export async function listQuotes(): Promise<QuoteSummary[]> {
  return (await api('/quotes', { schema: QuoteListResponseSchema })).quotes;
}

/**
 * One saved quote.
 * @param id - quote id
 */
export function getQuote(id: string): Promise<Quote> {
  return api(`/quotes/${encodeURIComponent(id)}`, { schema: QuoteSchema });
}

/**
 * Prices and saves a wholesale quote.
 * @param body - SKU, quantity, delivery date and customer
 */
export function createQuote(body: QuoteCreate): Promise<Quote> {
  return api('/quotes', { method: 'POST', body, schema: QuoteSchema });
}
