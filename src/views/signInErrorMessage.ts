import { ApiError } from '../api/client';

/**
 * The sentence the sign-in page shows for a failed attempt.
 * @param err - what `signIn` threw
 * @returns a message a person can act on
 */
export function signInErrorMessage(err: unknown): string {
  if (!(err instanceof ApiError)) return 'Something went wrong. Please try again.';
  if (err.status === 401) return 'E-mail or password is wrong.';
  if (err.code === 'account_deactivated') return err.message;
  if (err.status === 429) {
    const minutes = retryMinutes(err);
    return minutes
      ? `Too many attempts, try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`
      : 'Too many attempts, try again later.';
  }
  if (err.status === 0) return err.message;
  if (err.status === 400) return 'Check the e-mail address and password.';
  return `Signing in failed (${err.message}). Please try again.`;
}

/** Minutes until the next attempt: from the Retry-After header, `details.retryAfterSec`, or the message. */
function retryMinutes(err: ApiError): number | null {
  const details = err.details as { retryAfterSec?: unknown } | undefined;
  const seconds = err.retryAfterSec ?? Number(details && typeof details === 'object' ? details.retryAfterSec : NaN);
  if (Number.isFinite(seconds) && seconds > 0) return Math.max(1, Math.ceil(seconds / 60));
  const inMessage = /(\d+)\s*minute/i.exec(err.message);
  return inMessage ? Number(inMessage[1]) : null;
}
