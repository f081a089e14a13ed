/**
 * Addresses of the local development services one process starts (the payment and farm fakes), kept in the
 * database so that `npm run worker` processes on the same machine can reach them: the API process advertises the
 * address when it starts a fake, a worker looks it up when a job needs it. Real providers come from settings
 * (PAYMENT_SECRET_KEY, FARM_API_URL) and are never advertised.
 */
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../db/client';
import { serviceEndpoints } from '../db/schema';

/** The services a worker may need to reach. */
export type ServiceName = 'payments-fake' | 'farm-fake';

/**
 * Records where a service listens (the latest process to start one wins).
 * @param db - the shared database
 * @param name - which service
 * @param url - its base address, e.g. `http://127.0.0.1:41234`
 */
export async function advertiseEndpoint(db: Db, name: ServiceName, url: string): Promise<void> {
  await db
    .insert(serviceEndpoints)
    .values({ name, url })
    .onConflictDoUpdate({ target: serviceEndpoints.name, set: { url, updatedAt: sql`now()` } });
}

/**
 * Where a service listens, if a process advertised it.
 * @param db - the shared database
 * @param name - which service
 */
export async function findEndpoint(db: Db, name: ServiceName): Promise<string | undefined> {
  const [row] = await db.select().from(serviceEndpoints).where(eq(serviceEndpoints.name, name));
  return row?.url;
}
