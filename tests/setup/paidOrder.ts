/**
 * Shared fixture: a paid order of one unit of the first published variant, made through the order service the way
 * the payment webhook makes it (placed, then paid; the farm dispatch row is written in the payment's transaction).
 * Used by the fulfilment tests, which start where the storefront's own tests end.
 */
import { randomBytes } from 'node:crypto';
import type { AppContext } from '../../server/context';
import { listCatalogueVariants } from '../../server/services/catalogue';
import { createFromCheckout, markPaid, type MarkPaidOutcome } from '../../server/services/orderService';
import type { ShipTo } from '../../shared/schemas/shop';

/** What {@link payOneUnitOrder} needs. */
export interface PaidOrderInput {
  shipTo: ShipTo;
  email: string;
  /** Origin the customer's mail links point at. */
  siteOrigin: string;
}

/** The order made by {@link payOneUnitOrder}. */
export interface PaidOrder {
  id: string;
  /** As people read it, `NW-1001`. */
  number: string;
  /** What the order service said to the payment (`paid` unless something is wrong). */
  outcome: MarkPaidOutcome;
}

/**
 * Places and pays an order of one unit of the first published variant, priced at its catalogue price with no
 * shipping or VAT (the pricing has its own tests).
 * @param ctx - app context with a seeded catalogue
 * @param input - address, e-mail and origin
 */
export async function payOneUnitOrder(ctx: AppContext, input: PaidOrderInput): Promise<PaidOrder> {
  const [variant] = await listCatalogueVariants(ctx, {});
  const id = crypto.randomUUID();
  const unit = variant.priceCents;
  const order = await createFromCheckout(ctx.db, {
    id,
    customerToken: randomBytes(32).toString('base64url'),
    email: input.email,
    shipTo: input.shipTo,
    quote: {
      currency: 'EUR',
      lines: [
        {
          sku: variant.sku,
          productName: variant.family.name,
          quantity: 1,
          unitPriceMinor: unit,
          lineTotalMinor: unit,
          meshSha256: variant.sha256!,
          billableKg: 1,
        },
      ],
      subtotalMinor: unit,
      shippingMinor: 0,
      vatMinor: 0,
      vatRatePct: 0,
      totalMinor: unit,
      billableKg: 1,
      shippingZone: 'domestic',
    },
    paymentSessionId: `cs_test_${id}`,
    expiresAt: new Date(Date.now() + 3_600_000),
    siteOrigin: input.siteOrigin,
  });
  const outcome = await markPaid(ctx.db, id, {
    paymentIntentId: `pi_${id}`,
    amountMinor: unit,
    currency: 'EUR',
    eventId: `evt_${id}`,
  });
  return { id, number: order.number, outcome };
}
