/**
 * Background jobs as admins see them: jobs that failed their last attempt, sent again or discarded by an admin.
 * - `GET  /api/jobs/dead-letters?show=waiting|handled`  admin -> {@link DeadLettersResponse}
 * - `POST /api/jobs/dead-letters/:id/retry`              admin -> {@link DeadLetter}
 * - `POST /api/jobs/dead-letters/:id/discard`            admin -> {@link DeadLetter}
 */
import { z } from 'zod';

/** What an admin did with a dead letter. */
export const DEAD_LETTER_RESOLUTIONS = ['retried', 'discarded'] as const;

/** A job that failed its last attempt (or ran past its time limit on it). */
export const DeadLetterSchema = z.object({
  id: z.number().int(),
  /** The job type, e.g. `mail.deliver`, `family.variant`. */
  jobName: z.string(),
  /** What the job does, in words (the job type when this version no longer has it). */
  title: z.string(),
  jobId: z.string(),
  /** The job's payload as it was sent. */
  data: z.unknown(),
  /** The last error message. */
  error: z.string(),
  attempts: z.number().int(),
  failedAt: z.string(),
  /** Null while it waits for an admin. */
  resolution: z.enum(DEAD_LETTER_RESOLUTIONS).nullable(),
  resolvedAt: z.string().nullable(),
  /** Name of the admin who retried or discarded it (null when that person was removed). */
  resolvedByName: z.string().nullable(),
  /** False when this version no longer has the job type (it can only be discarded). */
  retryable: z.boolean(),
});
/** A dead letter. */
export type DeadLetter = z.infer<typeof DeadLetterSchema>;

/** Query of `GET /api/jobs/dead-letters`: the ones waiting for an admin (default) or those already handled. */
export const DeadLettersQuerySchema = z.object({
  show: z.enum(['waiting', 'handled'], 'Show waiting or handled messages.').default('waiting'),
});
/** Query of the dead-letter list. */
export type DeadLettersQuery = z.infer<typeof DeadLettersQuerySchema>;

/** Route parameters naming one dead letter. */
export const DeadLetterParamsSchema = z.object({
  id: z.coerce.number().int('no such failed job').positive('no such failed job'),
});

/** Answer of `GET /api/jobs/dead-letters` (newest first, at most 200), with how many wait in all. */
export const DeadLettersResponseSchema = z.object({
  deadLetters: z.array(DeadLetterSchema),
  waitingCount: z.number().int(),
});
/** Answer of `GET /api/jobs/dead-letters`. */
export type DeadLettersResponse = z.infer<typeof DeadLettersResponseSchema>;
