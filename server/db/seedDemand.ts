/**
 * Demo demand (an invented scenario, local demo only): ten weeks of paid shop orders for the published Hedgerow
 * Gable variants, growing for two of them, already printed by the farm and shipped or delivered, so the demand
 * screen and the run planner have something to show. Customers are invented, at example.test addresses.
 */
import { and, eq, isNotNull } from 'drizzle-orm';
import type { Db } from './client';
import { auditEvents, families, familyRevisions, familyVariants, farmDispatches, orderLines, orders } from './schema';
import { registerSeedStep } from './seedRegistry';
import { newId } from './newId';

const DAY_MS = 86_400_000;
const NAMES = ['Wren Adley', 'Corin Vale', 'Hollis Brook', 'Sela Marsh', 'Tamsin Ford', 'Ivo Lark', 'Petra Linn'];
const TOWNS = ['Lowmoor', 'Ashcombe', 'Brackenford', 'Millbridge'];

/** Deterministic pseudo-random numbers (a small linear congruential generator), so every new demo looks the same. */
function random(seed: number): () => number {
  let state = seed;
  return () => {
    state = (state * 1_103_515_245 + 12_345) % 2 ** 31;
    return state / 2 ** 31;
  };
}

/**
 * Inserts the demo orders with their lines, audit entries and finished dispatches.
 * @param db - database
 * @param now - today
 * @returns how many orders were made
 */
export async function seedDemand(db: Db, now = new Date()): Promise<number> {
  const variants = await db
    .select({
      sku: familyVariants.sku,
      sha256: familyVariants.sha256,
      cost: familyVariants.cost,
      name: familyRevisions.name,
    })
    .from(familyVariants)
    .innerJoin(familyRevisions, eq(familyRevisions.id, familyVariants.revisionId))
    .innerJoin(
      families,
      and(eq(families.id, familyRevisions.familyId), eq(families.publishedRevision, familyRevisions.number)),
    )
    .where(and(eq(familyVariants.status, 'done'), isNotNull(familyVariants.sha256)))
    .orderBy(familyVariants.index);
  const sold = variants.filter((v) => v.cost).slice(0, 6);
  if (sold.length === 0) return 0;
  const next = random(20_260_302);
  let made = 0;
  for (let week = 9; week >= 0; week--) {
    for (const [i, variant] of sold.entries()) {
      // Two variants grow week by week, the others sell a few each week.
      const mean = i < 2 ? 1 + (9 - week) * 0.9 : 1.2;
      const count = Math.max(0, Math.round(mean + (next() - 0.5) * 2));
      for (let n = 0; n < count; n++) {
        const paidAt = new Date(now.getTime() - (week * 7 + next() * 6 + 1) * DAY_MS);
        const quantity = next() < 0.8 ? 1 : 2;
        const unit = variant.cost!.suggestedPriceCents;
        const shipping = 690;
        const total = unit * quantity + shipping;
        const name = NAMES[Math.floor(next() * NAMES.length)];
        const [order] = await db
          .insert(orders)
          .values({
            id: newId(),
            customerToken: crypto.randomUUID().replaceAll('-', '') + crypto.randomUUID().replaceAll('-', ''),
            state: week >= 2 ? 'delivered' : 'shipped',
            email: `${name.split(' ')[0].toLowerCase()}.${made}@example.test`,
            shipTo: {
              name,
              line1: `${1 + Math.floor(next() * 80)} Orchard Lane`,
              line2: '',
              city: TOWNS[Math.floor(next() * TOWNS.length)],
              region: '',
              postalCode: `LM${1 + Math.floor(next() * 9)} ${1 + Math.floor(next() * 9)}AB`,
              country: 'GB',
            },
            currency: variant.cost!.currency,
            subtotalMinor: unit * quantity,
            shippingMinor: shipping,
            vatMinor: Math.round((total * 20) / 120),
            vatRatePct: 20,
            totalMinor: total,
            paymentSessionId: `cs_demo_${made}`,
            paymentIntentId: `pi_demo_${made}`,
            paidMinor: total,
            paidAt,
            siteOrigin: 'http://localhost:3000',
            expiresAt: new Date(paidAt.getTime() + 3_600_000),
            createdAt: new Date(paidAt.getTime() - 600_000),
            updatedAt: paidAt,
          })
          .returning();
        await db.insert(orderLines).values({
          orderId: order.id,
          position: 0,
          sku: variant.sku,
          productName: variant.name,
          meshSha256: variant.sha256!,
          quantity,
          unitPriceMinor: unit,
          lineTotalMinor: unit * quantity,
        });
        const reprints = next() < 0.08 ? 1 : 0;
        const code = `PW${String(100_000_000_000 + made * 7919).slice(0, 12)}`;
        await db.insert(farmDispatches).values({
          orderId: order.id,
          idempotencyKey: `order:${order.id}:dispatch:1`,
          status: 'done',
          farmWorkOrderId: `wo_demo${String(made).padStart(5, '0')}`,
          farmStage: 'handed_over',
          carrier: 'Parcelway',
          trackingCode: code,
          trackingUrl: `https://track.parcelway.example/${code}`,
          reprints,
          reprintsBySku: reprints ? { [variant.sku]: reprints } : {},
          createdAt: paidAt,
          updatedAt: paidAt,
        });
        const subject = `order:${order.id}`;
        await db.insert(auditEvents).values([
          { actorId: null, action: 'order.paid', subject, details: { seeded: true }, at: paidAt },
          {
            actorId: null,
            action: 'order.shipped',
            subject,
            details: { carrier: 'Parcelway', trackingCode: code, seeded: true },
            at: new Date(paidAt.getTime() + 2 * DAY_MS),
          },
        ]);
        made++;
      }
    }
  }
  return made;
}

registerSeedStep({
  name: 'demo-demand',
  demo: true,
  async run({ db, log }) {
    log(`  demo demand: ${await seedDemand(db)} paid orders over ten weeks`);
  },
});
