import { MeSchema, type Me, type PasswordChange, type SignIn } from '../../shared/schemas/auth';
import { api } from './client';

/**
 * Signs in with e-mail and password; the server sets the session cookie.
 * @param credentials - e-mail and password
 * @returns the signed-in person
 */
export function signIn(credentials: SignIn): Promise<Me> {
  return api('/auth/sign-in', { method: 'POST', body: credentials, schema: MeSchema });
}

/** Ends the current session. */
export async function signOut(): Promise<void> {
  await api('/auth/sign-out', { method: 'POST' });
}

/**
 * The signed-in person.
 * @returns the person, or throws an ApiError with status 401 when nobody is signed in
 */
export function fetchMe(): Promise<Me> {
  return api('/auth/me', { schema: MeSchema });
}

/**
 * Changes the signed-in person's password; their other sessions end, this one stays.
 * @param body - the current password and the new one
 */
export async function changePassword(body: PasswordChange): Promise<void> {
  await api('/auth/password', { method: 'POST', body });
}
