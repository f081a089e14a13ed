/**
 * Child process of the crash test: opens DATA_DIR (from the seeded test snapshot on first use), pays one order
 * through the order service (the dispatch row is written in the payment's transaction), prints `PAID <id> <number>`
 * and then hangs without ever starting the farm, so the parent can kill it between payment and dispatch.
 */
import { randomBytes } from 'node:crypto';
import { readFile } from 'node:fs/promises';
import { openDatabase } from '../../../server/db/client';
import { installDispatchHook } from '../../../server/farm/dispatchOrders';
import { listCatalogueVariants } from '../../../server/services/catalogue';
import { createFromCheckout, markPaid } from '../../../server/services/orderService';
import { createContext } from '../../../server/context';
import { EnvSchema } from '../../../server/env';

const dataDir = process.env.DATA_DIR!;
const snapshot = process.env.SNAPSHOT_PATH!;
const { pg, db } = await openDatabase({
  dataDir,
  loadDataDir: new Blob([new Uint8Array(await readFile(snapshot))]),
});
const ctx = createContext({ db, pg, env: EnvSchema.parse({ NODE_ENV: 'test' }), log: () => undefined });
installDispatchHook();
const [variant] = await listCatalogueVariants(ctx, {});
const id = crypto.randomUUID();
const unit = variant.priceCents;
const order = await createFromCheckout(db, {
  id,
  customerToken: randomBytes(32).toString('base64url'),
  email: 'crash.test@example.test',
  shipTo: {
    name: 'Crash Test',
    line1: '1 Kiln Lane',
    line2: '',
    city: 'Lowmoor',
    region: '',
    postalCode: 'LM1 1AA',
    country: 'GB',
  },
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
  paymentSessionId: `cs_crash_${id}`,
  expiresAt: new Date(Date.now() + 3_600_000),
  siteOrigin: 'http://localhost',
});
await markPaid(db, id, { paymentIntentId: `pi_${id}`, amountMinor: unit, currency: 'EUR', eventId: `evt_${id}` });
console.log(`PAID ${id} ${order.number}`);
setInterval(() => undefined, 60_000);
