/**
 * Child process of the crash test: opens DATA_DIR (from the seeded test snapshot on first use), pays one order
 * through the order service (the dispatch row is written in the payment's transaction), prints `PAID <id> <number>`
 * and then hangs without ever starting the farm, so the parent can kill it between payment and dispatch.
 */
import { readFile } from 'node:fs/promises';
import { openDatabase } from '../../../server/db/client';
import { installDispatchHook } from '../../../server/farm/dispatchOrders';
import { createContext } from '../../../server/context';
import { EnvSchema } from '../../../server/env';
import { payOneUnitOrder } from '../paidOrder';

const dataDir = process.env.DATA_DIR!;
const snapshot = process.env.SNAPSHOT_PATH!;
const { pg, db } = await openDatabase({
  dataDir,
  loadDataDir: new Blob([new Uint8Array(await readFile(snapshot))]),
});
const ctx = createContext({ db, pg, env: EnvSchema.parse({ NODE_ENV: 'test' }), log: () => undefined });
installDispatchHook();
const order = await payOneUnitOrder(ctx, {
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
  siteOrigin: 'http://localhost',
});
console.log(`PAID ${order.id} ${order.number}`);
setInterval(() => undefined, 60_000);
