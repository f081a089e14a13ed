import {
  QuoteListResponseSchema,
  QuoteSchema,
  type Quote,
  type QuoteInputBody,
  type QuoteStatus,
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
 * Prices and saves a new draft quote.
 * @param body - customer, dates, terms, tax, shipping and lines
 */
export function createQuote(body: QuoteInputBody): Promise<Quote> {
  return api('/quotes', { method: 'POST', body, schema: QuoteSchema });
}

/**
 * Re-prices and saves a draft or sent quote (a sent one becomes a draft again).
 * @param id - quote id
 * @param body - the whole quote as it should be
 */
export function updateQuote(id: string, body: QuoteInputBody): Promise<Quote> {
  return api(`/quotes/${encodeURIComponent(id)}`, { method: 'PUT', body, schema: QuoteSchema });
}

/**
 * Copies a quote into a new draft with a new reference.
 * @param id - the quote to copy
 */
export function copyQuote(id: string): Promise<Quote> {
  return api(`/quotes/${encodeURIComponent(id)}/copy`, { method: 'POST', schema: QuoteSchema });
}

/**
 * Moves a quote to another state (sent, accepted, expired, or back to draft).
 * @param id - quote id
 * @param status - the new state
 */
export function setQuoteStatus(id: string, status: QuoteStatus): Promise<Quote> {
  return api(`/quotes/${encodeURIComponent(id)}/status`, { method: 'POST', body: { status }, schema: QuoteSchema });
}
