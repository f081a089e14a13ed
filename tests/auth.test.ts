/**
 * Sign-in, sessions and people management. Cookie rules: HttpOnly, SameSite=Lax, Secure over HTTPS (OWASP Session
 * Management Cheat Sheet, from memory); lucia 3 renews a session when less than half its lifetime is left (lucia docs,
 * from memory); 10 failed sign-ins per 15 minutes is our own limit (common practice, no source).
 */
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { describe, expect, it } from 'vitest';
import { SESSION_COOKIE_NAME, SESSION_LIFETIME } from '../server/auth/lucia';
import { createApp } from '../server/app';
import { SIGN_IN_ATTEMPTS } from '../server/auth/signInLimiter';
import { auditEvents, people, sessions } from '../server/db/schema';
import { DEMO_PASSWORD, DEMO_PEOPLE } from '../server/db/seedDemo';
import { makeTestApp, useTestApp, TEST_ORIGIN } from './setup/testApp';

const t = useTestApp();

/** The session cookie from a response, split into its attributes. */
function sessionCookie(res: { headers: Record<string, unknown> }): { value: string; attributes: string[] } | undefined {
  const raw = ([] as string[]).concat((res.headers['set-cookie'] as string[] | string | undefined) ?? []);
  const line = raw.find((cookie) => cookie.startsWith(`${SESSION_COOKIE_NAME}=`));
  if (!line) return undefined;
  const [pair, ...attributes] = line.split(';').map((part) => part.trim());
  return { value: pair.slice(SESSION_COOKIE_NAME.length + 1), attributes: attributes.map((a) => a.toLowerCase()) };
}

const signInBody = (email: string, password = DEMO_PASSWORD) => ({ email, password });

describe('sign-in', () => {
  it.each(DEMO_PEOPLE.map((person) => [person.email, person]))(
    '%s signs in and sees their roles',
    async (_e, person) => {
      const agent = supertest.agent(t.app).set('Origin', TEST_ORIGIN);
      const res = await agent.post('/api/auth/sign-in').send(signInBody(person.email));
      expect(res.status).toBe(200);
      expect(res.body.person).toMatchObject({ email: person.email, name: person.name, roles: person.roles });
      expect(res.body.person.passwordHash).toBeUndefined();
      const me = await agent.get('/api/auth/me');
      expect(me.status).toBe(200);
      expect(me.body.person.email).toBe(person.email);
    },
  );

  it('accepts the e-mail in any case and with spaces', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('  MAREN@Fernhollow.TEST '));
    expect(res.status).toBe(200);
  });

  it('answers a wrong password and an unknown e-mail with the same 401', async () => {
    const wrongPassword = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('ada@fernhollow.test', 'not-the-password'));
    const unknownEmail = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('nobody@fernhollow.test'));
    for (const res of [wrongPassword, unknownEmail]) {
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('invalid_credentials');
      expect(sessionCookie(res)).toBeUndefined();
    }
    expect(wrongPassword.body.error.message).toBe(unknownEmail.body.error.message);
  });

  it('sets an HttpOnly, SameSite=Lax, Path=/ cookie, not Secure over plain HTTP', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('ada@fernhollow.test'));
    const cookie = sessionCookie(res);
    expect(cookie?.value.length).toBeGreaterThanOrEqual(20);
    expect(cookie?.attributes).toEqual(expect.arrayContaining(['httponly', 'samesite=lax', 'path=/']));
    expect(cookie?.attributes).not.toContain('secure');
    const maxAge = cookie?.attributes.find((a) => a.startsWith('max-age='));
    expect(Number(maxAge?.split('=')[1])).toBeCloseTo(SESSION_LIFETIME.seconds(), -1);
  });

  it('makes the cookie Secure when PUBLIC_ORIGIN is https', async () => {
    const https = await makeTestApp({ PUBLIC_ORIGIN: 'https://nest.example.test' });
    try {
      const res = await supertest(https.app)
        .post('/api/auth/sign-in')
        .set('Origin', 'https://nest.example.test')
        .send(signInBody('ada@fernhollow.test'));
      expect(res.status).toBe(200);
      expect(sessionCookie(res)?.attributes).toContain('secure');
    } finally {
      await https.close();
    }
  });

  it('makes the cookie Secure behind a trusted HTTPS proxy', async () => {
    const proxied = await makeTestApp({ TRUST_PROXY: 'true', PUBLIC_ORIGIN: undefined });
    try {
      const res = await supertest(proxied.app)
        .post('/api/auth/sign-in')
        .set('Host', 'nest.example.test')
        .set('Origin', 'https://nest.example.test')
        .set('X-Forwarded-Proto', 'https')
        .send(signInBody('ada@fernhollow.test'));
      expect(res.status).toBe(200);
      expect(sessionCookie(res)?.attributes).toContain('secure');
    } finally {
      await proxied.close();
    }
  });
});

describe('sign-out and sessions', () => {
  it('sign-out ends the session on the server and clears the cookie', async () => {
    const agent = await t.agent('designer', { fresh: true });
    const out = await agent.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect(sessionCookie(out)?.value).toBe('');
    expect((await agent.get('/api/auth/me')).status).toBe(401);
  });

  it('an old cookie no longer works after sign-out', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('ada@fernhollow.test'));
    const cookie = `${SESSION_COOKIE_NAME}=${sessionCookie(res)!.value}`;
    await supertest(t.app).post('/api/auth/sign-out').set('Origin', TEST_ORIGIN).set('Cookie', cookie).expect(204);
    const me = await supertest(t.app).get('/api/auth/me').set('Cookie', cookie);
    expect(me.status).toBe(401);
    expect(me.body.error.code).toBe('unauthenticated');
  });

  it('signing out when already signed out is harmless', async () => {
    const res = await supertest(t.app).post('/api/auth/sign-out').set('Origin', TEST_ORIGIN);
    expect(res.status).toBe(204);
  });

  it('an expired session is refused and its cookie cleared', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('tobias@fernhollow.test'));
    const id = sessionCookie(res)!.value;
    await t.ctx.db
      .update(sessions)
      .set({ expiresAt: new Date(Date.now() - 1000) })
      .where(eq(sessions.id, id));
    const me = await supertest(t.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE_NAME}=${id}`);
    expect(me.status).toBe(401);
    expect(sessionCookie(me)?.value).toBe('');
  });

  it('a session used in the second half of its life is renewed (new expiry and cookie)', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Origin', TEST_ORIGIN)
      .send(signInBody('tobias@fernhollow.test'));
    const id = sessionCookie(res)!.value;
    const oneDayLeft = new Date(Date.now() + 24 * 3600 * 1000);
    await t.ctx.db.update(sessions).set({ expiresAt: oneDayLeft }).where(eq(sessions.id, id));
    const me = await supertest(t.app).get('/api/auth/me').set('Cookie', `${SESSION_COOKIE_NAME}=${id}`);
    expect(me.status).toBe(200);
    expect(sessionCookie(me)?.value).toBe(id);
    const [row] = await t.ctx.db.select().from(sessions).where(eq(sessions.id, id));
    const leftMs = row.expiresAt.getTime() - Date.now();
    expect(leftMs).toBeGreaterThan(SESSION_LIFETIME.milliseconds() - 60_000);
  });

  it('a session in the first half of its life is not renewed', async () => {
    const agent = await t.agent('sales');
    const me = await agent.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(sessionCookie(me)).toBeUndefined();
  });
});

describe('origin check', () => {
  const body = signInBody('ada@fernhollow.test');
  it('refuses a state-changing request without Origin', async () => {
    const res = await supertest(t.app).post('/api/auth/sign-in').send(body);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('refuses a request from another site, even with a valid session', async () => {
    const admin = await t.agent('admin');
    const res = await admin
      .post('/api/people')
      .set('Origin', 'http://evil.example.test')
      .send({ email: 'x@fernhollow.test', name: 'X', roles: ['admin'], password: 'a-long-enough-password' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
    const [row] = await t.ctx.db.select().from(people).where(eq(people.email, 'x@fernhollow.test'));
    expect(row).toBeUndefined();
  });

  it('accepts an Origin matching the Host header', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/sign-in')
      .set('Host', 'studio.local:3000')
      .set('Origin', 'http://studio.local:3000')
      .send(body);
    expect(res.status).toBe(200);
  });

  it('lets reads through without Origin', async () => {
    expect((await supertest(t.app).get('/api/health')).status).toBe(200);
  });
});

describe('rate-limited sign-in', () => {
  it(`allows ${SIGN_IN_ATTEMPTS} failed attempts per address and e-mail, then answers 429`, async () => {
    const limited = await makeTestApp();
    try {
      const attempt = (email: string, password: string) =>
        supertest(limited.app).post('/api/auth/sign-in').set('Origin', TEST_ORIGIN).send({ email, password });
      for (let i = 0; i < SIGN_IN_ATTEMPTS; i++)
        expect((await attempt('maren@fernhollow.test', `guess-${i}`)).status).toBe(401);
      const blocked = await attempt('maren@fernhollow.test', DEMO_PASSWORD);
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('too_many_attempts');
      // another e-mail from the same address is counted separately
      expect((await attempt('ada@fernhollow.test', DEMO_PASSWORD)).status).toBe(200);
    } finally {
      await limited.close();
    }
  });

  it('holds across two API processes sharing one database', async () => {
    const shared = await makeTestApp();
    try {
      // A second app on the same database stands for a second API process (its own limiter instance).
      const second = createApp(shared.ctx);
      const attempt = (app: typeof second, password: string) =>
        supertest(app)
          .post('/api/auth/sign-in')
          .set('Origin', TEST_ORIGIN)
          .send({ email: 'tobias@fernhollow.test', password });
      for (let i = 0; i < SIGN_IN_ATTEMPTS; i++)
        expect((await attempt(i % 2 === 0 ? shared.app : second, `guess-${i}`)).status).toBe(401);
      expect((await attempt(shared.app, DEMO_PASSWORD)).status).toBe(429);
      expect((await attempt(second, DEMO_PASSWORD)).status).toBe(429);
    } finally {
      await shared.close();
    }
  });
});

describe('people (admin)', () => {
  it('adds a person who can then sign in, and refuses a second one with the same e-mail', async () => {
    const admin = await t.agent('admin');
    const created = await admin.post('/api/people').send({
      email: 'Wren@Fernhollow.test',
      name: 'Wren Ashby',
      roles: ['designer', 'sales'],
      password: 'wren-password-1',
    });
    expect(created.status).toBe(201);
    expect(created.body.person).toMatchObject({ email: 'wren@fernhollow.test', roles: ['designer', 'sales'] });
    const again = await admin
      .post('/api/people')
      .send({ email: 'wren@fernhollow.test', name: 'Wren Again', roles: ['sales'], password: 'wren-password-2' });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('email_taken');
    const wren = await t.signIn('wren@fernhollow.test', 'wren-password-1');
    expect((await wren.get('/api/auth/me')).body.person.roles).toEqual(['designer', 'sales']);
    const list = await admin.get('/api/people');
    expect(list.body.people.map((p: { email: string }) => p.email)).toContain('wren@fernhollow.test');
  });

  it('changes roles with immediate effect and writes the change to the audit log', async () => {
    const admin = await t.agent('admin');
    const sales = await t.agent('sales', { fresh: true });
    const me = (await sales.get('/api/auth/me')).body.person;
    expect((await sales.get('/api/people')).status).toBe(403);
    const patched = await admin.patch(`/api/people/${me.id}`).send({ roles: ['sales', 'admin'] });
    expect(patched.status).toBe(200);
    expect(patched.body.person.roles).toEqual(['sales', 'admin']);
    expect((await sales.get('/api/people')).status).toBe(200);
    const events = await t.ctx.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.subject, `person:${me.id}`));
    const change = events.find((event) => event.action === 'person.roles_changed');
    expect(change?.details).toEqual({ before: ['sales'], after: ['sales', 'admin'] });
    const adminId = (await admin.get('/api/auth/me')).body.person.id;
    expect(change?.actorId).toBe(adminId);
    await admin
      .patch(`/api/people/${me.id}`)
      .send({ roles: ['sales'] })
      .expect(200);
  });

  it('will not remove the last admin', async () => {
    const admin = await t.agent('admin');
    const self = (await admin.get('/api/auth/me')).body.person;
    const res = await admin.patch(`/api/people/${self.id}`).send({ roles: ['designer'] });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('last_admin');
    expect((await admin.get('/api/auth/me')).body.person.roles).toEqual(['admin']);
  });
});
