/** The customer's mails about an order: confirmation with the private link, shipped with tracking, refunded. */
import { formatOrderNumber, type OrderState } from '../../shared/schemas/order';
import type { OrderLineRow, OrderRow } from '../db/schema';
import type { OutgoingMail } from '../mail/queueMail';
import { formatMoney } from '../../shared/format';

/**
 * The private address of an order's page for its customer.
 * @param row - the order
 */
export function customerOrderUrl(row: Pick<OrderRow, 'siteOrigin' | 'customerToken'>): string {
  return `${row.siteOrigin}/shop/orders/${row.customerToken}`;
}

/**
 * The mail the customer gets when an order enters `state`, or null when that state sends none.
 * @param row - the order after the change
 * @param state - the state entered
 * @param lines - its lines
 * @param studioName - the studio, signing the mail
 * @param locale - the studio's locale (BCP 47) amounts are written in; the current format locale when left out
 */
export function orderMail(
  row: OrderRow,
  state: OrderState,
  lines: OrderLineRow[],
  studioName: string,
  locale?: string,
): OutgoingMail | null {
  const number = formatOrderNumber(row.number);
  const link = customerOrderUrl(row);
  const money = (minor: number) => formatMoney(minor, row.currency, locale);
  const footer = ['', `Your order page (keep this link private; it needs no account): ${link}`, '', studioName];
  if (state === 'paid') {
    return {
      to: [row.email],
      subject: `Order ${number} confirmed: thank you`,
      text: [
        `Hello ${row.shipTo.name},`,
        '',
        `we have your payment of ${money(row.totalMinor)} for order ${number}. Each box is printed for you, checked and then shipped to:`,
        '',
        ...addressLines(row),
        '',
        ...lines.map((line) => `  ${line.quantity} × ${line.productName} (${line.sku})  ${money(line.lineTotalMinor)}`),
        `  Shipping  ${money(row.shippingMinor)}`,
        `  Total  ${money(row.totalMinor)} (includes ${money(row.vatMinor)} VAT at ${row.vatRatePct} %)`,
        '',
        'We will write again when the parcel leaves us, with a link to follow it.',
        ...footer,
      ].join('\n'),
    };
  }
  if (state === 'shipped') {
    return {
      to: [row.email],
      subject: `Order ${number} is on its way`,
      text: [
        `Hello ${row.shipTo.name},`,
        '',
        `order ${number} has left us.`,
        row.trackingUrl ? `Follow the parcel here: ${row.trackingUrl}` : 'The carrier did not give us a tracking link.',
        '',
        'Before you hang the box: choose a shaded spot facing north to east, out of reach of cats, and follow local advice on height and predator guards.',
        ...footer,
      ].join('\n'),
    };
  }
  if (state === 'refunded') {
    return {
      to: [row.email],
      subject: `Order ${number} refunded`,
      text: [
        `Hello ${row.shipTo.name},`,
        '',
        `we have refunded ${money(row.refundedMinor ?? row.paidMinor ?? row.totalMinor)} for order ${number} to the card you paid with. Banks usually show it within 5 to 10 working days.`,
        ...footer,
      ].join('\n'),
    };
  }
  return null;
}

function addressLines(row: OrderRow): string[] {
  const a = row.shipTo;
  return [a.name, a.line1, a.line2, [a.postalCode, a.city].filter(Boolean).join(' '), a.region, a.country]
    .filter((line) => line && line.trim())
    .map((line) => `  ${line}`);
}
