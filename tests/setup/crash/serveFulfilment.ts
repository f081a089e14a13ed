/**
 * Child process of the crash test: boots the real server on DATA_DIR and PORT with the farm at FARM_API_URL, and
 * prints `READY` once it listens (the dispatcher then sends whatever the outbox holds).
 */
import { boot } from '../../../server/boot';
import { EnvSchema } from '../../../server/env';

await boot({
  dataDir: process.env.DATA_DIR!,
  port: Number(process.env.PORT),
  env: EnvSchema.parse({ NODE_ENV: 'test', PORT: process.env.PORT }),
  log: () => undefined,
});
console.log('READY');
