/** The periodic job that cancels unpaid orders whose checkout has expired (abandoned at the payment page). */
import { z } from 'zod';
import { defineJob } from '../jobs/JobQueue';
import { expireAbandonedCheckouts } from '../services/checkoutService';
import { ensurePaymentsForJob } from './paymentsForJob';

/** Every minute: cancel each unpaid order past its expiry (its session expired at the provider first). */
export const expireCheckoutsJob = defineJob({
  name: 'checkout.expire',
  title: 'Closing abandoned checkouts',
  data: z.object({}),
  retry: { limit: 3, delaySec: 30, backoff: true },
  timeLimitSec: 120,
  concurrency: 1,
  everySec: 60,
  async handler(_data, { ctx }) {
    // A worker reaches the provider (or the fake an API process advertised); nothing known yet: the next run.
    if (!(await ensurePaymentsForJob(ctx))) {
      if (ctx.jobs.kind === 'in-process') return;
      throw new Error('no payment service is known yet: set PAYMENT_SECRET_KEY, or start an API process');
    }
    const cancelled = await expireAbandonedCheckouts(ctx);
    if (cancelled > 0) ctx.log(`  shop: ${cancelled} abandoned checkout(s) expired`);
  },
});
