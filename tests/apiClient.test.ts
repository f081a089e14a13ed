/** The client's typed fetch wrapper and the sign-in messages it feeds, against a stubbed `fetch`. */
import { afterEach, describe, expect, it, vi } from 'vitest';
import { MeSchema } from '../shared/schemas/auth';
import { api, ApiError } from '../src/api/client';
import { signInErrorMessage } from '../src/views/signInErrorMessage';

type FetchArgs = [input: string, init: RequestInit];

function stubFetch(answer: () => Response | Promise<Response>): FetchArgs[] {
  const calls: FetchArgs[] = [];
  vi.stubGlobal('fetch', async (input: string, init: RequestInit) => {
    calls.push([input, init]);
    return answer();
  });
  return calls;
}

function json(status: number, body: unknown, headers: Record<string, string> = {}): Response {
  return new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json', ...headers } });
}

const PERSON = { id: 'p1', email: 'maren@fernhollow.test', name: 'Maren Hale', roles: ['designer'] };

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('api()', () => {
  it('sends JSON with same-origin credentials under /api and returns the answer parsed by the schema', async () => {
    const calls = stubFetch(() => json(200, { person: PERSON, studioName: 'Fernhollow Studio', locale: 'en-GB' }));
    const me = await api('/auth/sign-in', {
      method: 'POST',
      body: { email: 'a@b.test', password: 'x' },
      schema: MeSchema,
    });
    expect(me.person.roles).toEqual(['designer']);
    const [url, init] = calls[0]!;
    expect(url).toBe('/api/auth/sign-in');
    expect(init.method).toBe('POST');
    expect(init.credentials).toBe('same-origin');
    expect((init.headers as Record<string, string>)['Content-Type']).toBe('application/json');
    expect(JSON.parse(init.body as string)).toEqual({ email: 'a@b.test', password: 'x' });
  });

  it('turns the error shape into an ApiError with status, code, message, details and field errors', async () => {
    const details = [
      { path: ['email'], message: 'Invalid email address' },
      { path: ['roles', 0], message: 'Invalid option' },
    ];
    stubFetch(() => json(400, { error: { code: 'bad_request', message: 'email: Invalid email address', details } }));
    const err = await api('/people', { method: 'POST', body: {} }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    const apiErr = err as ApiError;
    expect(apiErr.status).toBe(400);
    expect(apiErr.code).toBe('bad_request');
    expect(apiErr.message).toBe('email: Invalid email address');
    expect(apiErr.details).toEqual(details);
    expect(apiErr.fieldErrors).toEqual({ email: 'Invalid email address', 'roles.0': 'Invalid option' });
  });

  it('reads Retry-After as seconds or as an HTTP date', async () => {
    // source: RFC 9110 §10.2.3 — Retry-After is delay-seconds or an HTTP-date
    stubFetch(() => json(429, { error: { code: 'too_many_attempts', message: 'Too many' } }, { 'Retry-After': '900' }));
    expect(((await api('/auth/sign-in').catch((e: unknown) => e)) as ApiError).retryAfterSec).toBe(900);

    const inTwoMinutes = new Date(Date.now() + 120_000).toUTCString();
    stubFetch(() =>
      json(429, { error: { code: 'too_many_attempts', message: 'Too many' } }, { 'Retry-After': inTwoMinutes }),
    );
    const seconds = ((await api('/auth/sign-in').catch((e: unknown) => e)) as ApiError).retryAfterSec!;
    // An HTTP date has whole-second resolution: within 2 s of 120 s (common practice, no source).
    expect(Math.abs(seconds - 120)).toBeLessThanOrEqual(2);
  });

  it('reports answers that are not the error shape, not JSON, or not the expected shape', async () => {
    stubFetch(() => new Response('<html>Bad gateway</html>', { status: 502 }));
    const notJson = (await api('/health').catch((e: unknown) => e)) as ApiError;
    expect([notJson.status, notJson.code]).toEqual([502, 'bad_response']);

    stubFetch(() => json(500, { oops: true }));
    const otherShape = (await api('/health').catch((e: unknown) => e)) as ApiError;
    expect([otherShape.status, otherShape.code]).toEqual([500, 'http_error']);

    stubFetch(() =>
      json(200, { person: { ...PERSON, roles: ['gardener'] }, studioName: 'Fernhollow Studio', locale: 'en-GB' }),
    );
    const badAnswer = (await api('/auth/me', { schema: MeSchema }).catch((e: unknown) => e)) as ApiError;
    expect([badAnswer.status, badAnswer.code]).toEqual([200, 'bad_response']);
  });

  it('reports an unreachable server as status 0', async () => {
    stubFetch(() => {
      throw new TypeError('Failed to fetch');
    });
    const err = (await api('/auth/me').catch((e: unknown) => e)) as ApiError;
    expect(err).toBeInstanceOf(ApiError);
    expect(err.status).toBe(0);
    expect(err.code).toBe('network');
  });
});

describe('signInErrorMessage()', () => {
  // The wording is the product's own (issue 2 asks for a clear message); no outside source.
  it('says the e-mail or password is wrong on 401, without saying which', () => {
    expect(signInErrorMessage(new ApiError(401, 'invalid_credentials', 'E-mail or password is wrong.'))).toBe(
      'E-mail or password is wrong.',
    );
  });

  it('tells a deactivated person so, in the server words', () => {
    const message = 'This account has been deactivated. Ask your studio admin if you need to sign in again.';
    expect(signInErrorMessage(new ApiError(403, 'account_deactivated', message))).toBe(message);
  });

  it('names the wait in minutes on 429, from Retry-After or from the message', () => {
    expect(signInErrorMessage(new ApiError(429, 'too_many_attempts', 'Too many', undefined, 900))).toBe(
      'Too many attempts, try again in 15 minutes.',
    );
    expect(signInErrorMessage(new ApiError(429, 'too_many_attempts', 'Too many', undefined, 30))).toBe(
      'Too many attempts, try again in 1 minute.',
    );
    expect(signInErrorMessage(new ApiError(429, 'too_many_attempts', 'Wait 15 minutes and try again.'))).toBe(
      'Too many attempts, try again in 15 minutes.',
    );
    expect(signInErrorMessage(new ApiError(429, 'too_many_attempts', 'Slow down'))).toBe(
      'Too many attempts, try again later.',
    );
  });

  it('passes on the network message and has a fallback for anything else', () => {
    const offline = new ApiError(0, 'network', 'The server could not be reached. Check your connection and try again.');
    expect(signInErrorMessage(offline)).toBe(offline.message);
    expect(signInErrorMessage(new Error('boom'))).toBe('Something went wrong. Please try again.');
  });
});
