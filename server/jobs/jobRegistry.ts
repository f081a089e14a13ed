/**
 * Every job type background processes work: `npm start` (one process) and `npm run worker` pass this list to
 * `ctx.jobs.work()`. Add a new job here after defining it with `defineJob` (see README.md in this folder). The mail
 * job is not listed: the process that starts mail works it (`startMail`).
 */
import { computeVariantJob } from './computeVariantJob';
import type { AnyJobDefinition } from './JobQueue';
import { expireCheckoutsJob } from '../payments/expireCheckoutsJob';
import { deliverMailJob } from '../mail/deliverMailJob';
import { farmRoundJob } from '../farm/farmJobs';

/** The job types a worker runs (and an API process that runs jobs). */
export const BACKGROUND_JOBS: readonly AnyJobDefinition[] = [computeVariantJob, expireCheckoutsJob, farmRoundJob];

/** Every job type of this version, including mail, which the process that starts mail works. */
export const ALL_JOBS: readonly AnyJobDefinition[] = [...BACKGROUND_JOBS, deliverMailJob];

/**
 * The job type with this queue name, if this version has it (a dead letter may name one that is gone).
 * @param name - e.g. `mail.deliver`
 */
export function jobNamed(name: string): AnyJobDefinition | undefined {
  return ALL_JOBS.find((job) => job.name === name);
}
