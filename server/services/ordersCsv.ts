/** Orders as CSV for operations: one row per order line, text cells neutralised against formula injection. */
import type { Order } from '../../shared/schemas/order';
import { csvText, type CsvCell } from '../csv/csvText';
import { currencyDigits } from '../../shared/format';

/** Column titles, in order. */
export const ORDERS_CSV_COLUMNS = [
  'Order',
  'Placed',
  'State',
  'Payment flag',
  'E-mail',
  'Name',
  'Address line 1',
  'Address line 2',
  'Town or city',
  'Region',
  'Postcode',
  'Country',
  'SKU',
  'Product',
  'Mesh hash',
  'Quantity',
  'Unit price',
  'Line total',
  'Shipping',
  'VAT',
  'Order total',
  'Currency',
  'Tracking link',
] as const;

/**
 * The CSV text of some orders (amounts in currency units with the currency's decimals).
 * @param orders - the orders, with their lines
 */
export function ordersCsv(orders: readonly Order[]): string {
  const rows: CsvCell[][] = [];
  for (const order of orders) {
    const digits = currencyDigits(order.currency);
    const amount = (minor: number) => (minor / 10 ** digits).toFixed(digits);
    const a = order.shipTo;
    for (const line of order.lines) {
      rows.push([
        order.number,
        order.createdAt,
        order.state,
        order.payment.flag ?? '',
        order.email,
        a.name,
        a.line1,
        a.line2,
        a.city,
        a.region,
        a.postalCode,
        a.country,
        line.sku,
        line.productName,
        line.meshSha256,
        line.quantity,
        amount(line.unitPriceMinor),
        amount(line.lineTotalMinor),
        amount(order.shippingMinor),
        amount(order.vatMinor),
        amount(order.totalMinor),
        order.currency,
        order.trackingUrl ?? '',
      ]);
    }
  }
  return csvText(ORDERS_CSV_COLUMNS, rows, { numericColumns: [16, 17, 18, 19, 20] });
}
