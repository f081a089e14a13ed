import {
  DeadLetterSchema,
  DeadLettersResponseSchema,
  type DeadLetter,
  type DeadLettersQuery,
  type DeadLettersResponse,
} from '../../shared/schemas/jobs';
import { api } from './client';

/** Jobs that failed their last attempt: waiting for an admin, or already handled (admin). @param show - which */
export function listDeadLetters(show: DeadLettersQuery['show']): Promise<DeadLettersResponse> {
  return api(`/jobs/dead-letters?show=${show}`, { schema: DeadLettersResponseSchema });
}

/** Sends a failed job again with its payload (admin). @param id - the dead letter */
export function retryDeadLetter(id: number): Promise<DeadLetter> {
  return api(`/jobs/dead-letters/${id}/retry`, { method: 'POST', schema: DeadLetterSchema });
}

/** Discards a failed job (admin). @param id - the dead letter */
export function discardDeadLetter(id: number): Promise<DeadLetter> {
  return api(`/jobs/dead-letters/${id}/discard`, { method: 'POST', schema: DeadLetterSchema });
}
