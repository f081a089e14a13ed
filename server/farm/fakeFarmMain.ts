/**
 * Runs the fake farm as its own process (`npx tsx server/farm/fakeFarmMain.ts`), e.g. to let it outlive a server
 * that is killed in a test. Reads FARM_API_KEY, FARM_NOTICE_SECRET, FARM_FAKE_SPEED, FARM_FAKE_PORT and
 * FARM_FAKE_NOTICE_URL (where to send notices); prints `fake farm listening on <url>` when ready.
 */
import { FakeFarm } from './FakeFarm';
import { loadFarmEnv } from './farmEnv';

const env = loadFarmEnv({ ...process.env, FARM_API_URL: undefined });
const secret = env.FARM_NOTICE_SECRET;
if (!secret) throw new Error('FARM_NOTICE_SECRET is required to run the fake farm on its own');
const farm = new FakeFarm({
  apiKey: env.FARM_API_KEY,
  noticeSecret: secret,
  speed: env.FARM_FAKE_SPEED,
  noticeUrl: process.env.FARM_FAKE_NOTICE_URL,
});
const url = await farm.listen(env.FARM_FAKE_PORT);
console.log(`fake farm listening on ${url}`);
const stop = () => void farm.close().then(() => process.exit(0));
process.on('SIGTERM', stop);
process.on('SIGINT', stop);
