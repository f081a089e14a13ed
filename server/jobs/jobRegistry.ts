/**
 * Every job type background processes work: `npm start` (one process) and `npm run worker` pass this list to
 * `ctx.jobs.work()`. Add a new job here after defining it with `defineJob` (see README.md in this folder). The mail
 * job is not listed: the process that starts mail works it (`startMail`).
 */
import { computeVariantJob } from './computeVariantJob';
import type { AnyJobDefinition } from './JobQueue';
import { expireCheckoutsJob } from '../payments/expireCheckoutsJob';

/** The job types a worker runs. */
export const BACKGROUND_JOBS: readonly AnyJobDefinition[] = [computeVariantJob, expireCheckoutsJob];
