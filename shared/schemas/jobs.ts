/**
 * Background jobs as admins see them.
 * - `GET /api/jobs/dead-letters`   admin -> {@link DeadLettersResponse}
 */
import { z } from 'zod';

/** A job that failed its last attempt (or ran past its time limit on it). */
export const DeadLetterSchema = z.object({
  id: z.number().int(),
  /** The job type, e.g. `mail.deliver`, `family.variant`. */
  jobName: z.string(),
  jobId: z.string(),
  /** The job's payload as it was sent. */
  data: z.unknown(),
  /** The last error message. */
  error: z.string(),
  attempts: z.number().int(),
  failedAt: z.string(),
});
/** A dead letter. */
export type DeadLetter = z.infer<typeof DeadLetterSchema>;

/** Answer of `GET /api/jobs/dead-letters` (newest first, at most 200). */
export const DeadLettersResponseSchema = z.object({ deadLetters: z.array(DeadLetterSchema) });
/** Answer of `GET /api/jobs/dead-letters`. */
export type DeadLettersResponse = z.infer<typeof DeadLettersResponseSchema>;
