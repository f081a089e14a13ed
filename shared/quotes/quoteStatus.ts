/**
 * The life of a quote: draft → sent → accepted, and expired when its validity date has passed or a sales person
 * marks it so. Only drafts and sent quotes can be edited; accepted and expired quotes are final (copy one to start
 * again). These are our own product rules (common practice for trade quotes, no source).
 */
import type { QuoteStatus } from '../schemas/quote';

/** The states a quote may move to from each state, by hand. */
export const QUOTE_TRANSITIONS: Readonly<Record<QuoteStatus, readonly QuoteStatus[]>> = {
  draft: ['sent', 'expired'],
  sent: ['accepted', 'draft', 'expired'],
  accepted: [],
  expired: [],
};

/** How each state reads to people. */
export const QUOTE_STATUS_LABELS: Readonly<Record<QuoteStatus, string>> = {
  draft: 'Draft',
  sent: 'Sent',
  accepted: 'Accepted',
  expired: 'Expired',
};

/**
 * The state of a quote on a given day: a draft or sent quote whose validity date has passed reads as expired.
 * @param stored - the state saved with the quote
 * @param validUntil - last valid day, YYYY-MM-DD
 * @param today - YYYY-MM-DD
 */
export function quoteStatusOn(stored: QuoteStatus, validUntil: string, today: string): QuoteStatus {
  return (stored === 'draft' || stored === 'sent') && validUntil < today ? 'expired' : stored;
}

/**
 * Whether a quote in this state can still be changed.
 * @param status - the state as of today
 */
export function isQuoteEditable(status: QuoteStatus): boolean {
  return status === 'draft' || status === 'sent';
}

/**
 * Why a quote cannot move from one state to another, in words for people; null when it can.
 * @param from - the state as of today
 * @param to - the state asked for
 */
export function quoteTransitionRefusal(from: QuoteStatus, to: QuoteStatus): string | null {
  if (QUOTE_TRANSITIONS[from].includes(to)) return null;
  if (from === to) return `This quote is already ${QUOTE_STATUS_LABELS[to].toLowerCase()}.`;
  if (from === 'accepted') return 'This quote has been accepted, which is final. Copy it to make a new one.';
  if (from === 'expired') return 'This quote has expired. Copy it to make a new one with new dates.';
  if (to === 'accepted') return 'Send the quote to the customer before marking it accepted.';
  return `A ${QUOTE_STATUS_LABELS[from].toLowerCase()} quote cannot be marked ${QUOTE_STATUS_LABELS[to].toLowerCase()}.`;
}
