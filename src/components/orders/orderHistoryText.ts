/** Words for the entries of an order's history (its audit trail), payment and farm steps alike, for people. */
import { FARM_STAGE_LABELS, HOLD_LABELS } from '../../../shared/schemas/fulfilment';

/** What each audited action is called on the order page. */
export const ORDER_ACTION_WORDS: Record<string, string> = {
  'order.placed': 'Placed by the customer',
  'order.paid': 'Paid',
  'order.payment_flagged': 'Payment flagged',
  'order.flag_cleared': 'Payment flag cleared',
  'order.in_production': 'Sent to production',
  'order.shipped': 'Shipped',
  'order.delivered': 'Delivered',
  'order.cancelled': 'Cancelled',
  'order.refunded': 'Refunded',
  'order.address_corrected': 'Address corrected',
  'farm.dispatched': 'Sent to the farm',
  'farm.stage': 'News from the farm',
  'farm.held': 'Held by the farm',
  'farm.waiting': 'Waiting for the farm',
  'farm.refused': 'Refused by the farm',
  'farm.reprint': 'Reprinted at the farm',
  'farm.redispatched': 'Sent to the farm again',
  'farm.withdrawn': 'Withdrawn from the farm',
};

/**
 * The details of one history entry in a line: reasons, notes, amounts, the farm's stage, parcel and ids.
 * @param details - the entry's stored details
 * @param money - formats an amount in minor units in the order's currency
 */
export function orderHistoryDetail(details: Record<string, unknown>, money: (minor: number) => string): string {
  const parts: string[] = [];
  const text = (key: string) => (typeof details[key] === 'string' ? (details[key] as string) : null);
  if (text('reason')) parts.push(text('reason')!);
  if (text('note')) parts.push(text('note')!);
  if (text('trackingUrl')) parts.push(`tracking ${text('trackingUrl')}`);
  if (typeof details.refundedMinor === 'number') parts.push(`refunded ${money(details.refundedMinor)}`);
  if (details.flag === 'amount_mismatch' && typeof details.paidMinor === 'number')
    parts.push(`paid ${money(details.paidMinor)}, expected ${money(Number(details.expectedMinor))}`);
  if (details.flag === 'currency_mismatch') parts.push(`paid in ${String(details.currency)}`);
  const stage = text('stage');
  if (stage && stage in FARM_STAGE_LABELS) parts.push(FARM_STAGE_LABELS[stage as keyof typeof FARM_STAGE_LABELS]);
  const hold = text('hold');
  if (hold && hold in HOLD_LABELS) parts.push(HOLD_LABELS[hold as keyof typeof HOLD_LABELS]);
  if (text('message')) parts.push(text('message')!);
  if (text('error')) parts.push(text('error')!);
  if (text('carrier') && text('trackingCode')) parts.push(`${text('carrier')} ${text('trackingCode')}`);
  if (typeof details.reprints === 'number') parts.push(`${details.reprints} reprinted in all`);
  if (text('farmWorkOrderId')) parts.push(`farm work order ${text('farmWorkOrderId')}`);
  if (typeof details.attempt === 'number' && details.attempt > 1) parts.push(`attempt ${details.attempt}`);
  return parts.join(' · ');
}

/**
 * Who did a history entry, for people: the signed-in person's name, or for entries without one the party that
 * acts on its own (the customer placing it, the payment service, the print farm, or the app itself).
 * @param entry - the history entry
 */
export function orderHistoryActor(entry: { action: string; actor: string | null }): string {
  if (entry.actor) return entry.actor;
  if (entry.action === 'order.placed') return 'customer';
  if (entry.action === 'order.paid' || entry.action === 'order.payment_flagged') return 'payment service';
  if (entry.action.startsWith('farm.') || entry.action === 'order.in_production' || entry.action === 'order.shipped')
    return 'print farm';
  return 'automatic';
}
