/** The `mail.deliver` job: sends what is due in the outbox and queues itself again for the next due retry. */
import { z } from 'zod';
import { defineJob } from '../jobs/JobQueue';
import { mailRuntime } from './mailRuntimes';

/** Idempotency key of a delivery round asked for now (a workflow step queued a message). */
export const DELIVER_NOW_KEY = 'now';
/** Idempotency key of the round queued for the next retry that falls due. */
const DELIVER_LATER_KEY = 'later';

/**
 * Delivers due outbox messages in the process that started mail (`startMail`); a process without mail does nothing
 * (the messages stay in the outbox for a process that has it). Safe to run twice: messages are claimed one by one.
 */
export const deliverMailJob = defineJob({
  name: 'mail.deliver',
  title: 'Sending e-mail from the outbox',
  data: z.object({}),
  retry: { limit: 3, delaySec: 5, backoff: true },
  timeLimitSec: 120,
  everySec: 30,
  async handler(_data, { ctx, signal }) {
    const runtime = mailRuntime(ctx);
    if (!runtime) return;
    const nextDueAt = await runtime.sender.deliverDue(signal);
    if (nextDueAt && !signal.aborted) {
      const startAfterSec = Math.max(0, (nextDueAt.getTime() - Date.now()) / 1000);
      await ctx.jobs.send(deliverMailJob, {}, { key: DELIVER_LATER_KEY, startAfterSec });
    }
  },
});
