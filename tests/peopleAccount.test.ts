/**
 * Account actions: an admin deactivates and reactivates a person, resets a password (generated, answered once) and
 * renames; everyone changes their own password with the current one. Ending every session of a deactivated person or
 * after a password change follows the OWASP Session Management Cheat Sheet ("renew or invalidate sessions after a
 * password change"), from memory; the 10-character minimum is our own rule (common practice, no source).
 */
import { eq } from 'drizzle-orm';
import supertest from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { generatePassword } from '../server/auth/generatePassword';
import { auditEvents, people } from '../server/db/schema';
import { useTestApp, TEST_ORIGIN, type TestAgent } from './setup/testApp';

const t = useTestApp();
let admin: TestAgent;
beforeAll(async () => {
  admin = await t.agent('admin');
});

let serial = 0;
/** A new person (sales), with a signed-in agent of theirs. */
async function newPerson(password = 'first-password-1'): Promise<{ id: string; email: string; agent: TestAgent }> {
  serial += 1;
  const email = `account-${serial}@fernhollow.test`;
  const res = await admin.post('/api/people').send({ email, name: `Account ${serial}`, roles: ['sales'], password });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return { id: res.body.person.id as string, email, agent: await t.signIn(email, password) };
}

const signIn = (email: string, password: string) =>
  supertest(t.app).post('/api/auth/sign-in').set('Origin', TEST_ORIGIN).send({ email, password });

describe('deactivate and reactivate', () => {
  it('a deactivated person loses their sessions and cannot sign in; reactivated, they can again', async () => {
    const p = await newPerson();
    expect((await p.agent.get('/api/auth/me')).status).toBe(200);

    const off = await admin.post(`/api/people/${p.id}/deactivate`);
    expect(off.status).toBe(200);
    expect(off.body.person).toMatchObject({ id: p.id, active: false });
    expect(typeof off.body.person.deactivatedAt).toBe('string');
    expect((await p.agent.get('/api/auth/me')).status).toBe(401);

    const refused = await signIn(p.email, 'first-password-1');
    expect(refused.status).toBe(403);
    expect(refused.body.error.code).toBe('account_deactivated');
    expect(refused.body.error.message).toMatch(/deactivated/);
    // A wrong password still gets the answer everyone gets, so deactivation is not revealed to a guesser.
    expect((await signIn(p.email, 'wrong-password')).body.error.code).toBe('invalid_credentials');

    const list = await admin.get('/api/people');
    expect(list.body.people.find((x: { id: string }) => x.id === p.id)).toMatchObject({ active: false });

    const on = await admin.post(`/api/people/${p.id}/reactivate`);
    expect(on.body.person).toMatchObject({ active: true, deactivatedAt: null });
    expect((await signIn(p.email, 'first-password-1')).status).toBe(200);

    const actions = (
      await t.ctx.db
        .select()
        .from(auditEvents)
        .where(eq(auditEvents.subject, `person:${p.id}`))
    ).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['person.deactivated', 'person.reactivated']));
  });

  it('an admin cannot deactivate their own account', async () => {
    const me = await admin.get('/api/auth/me');
    const res = await admin.post(`/api/people/${me.body.person.id}/deactivate`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('own_account');
  });

  it('the last active admin cannot be deactivated or lose the role', async () => {
    const second = await admin.post('/api/people').send({
      email: 'second-admin@fernhollow.test',
      name: 'Second Admin',
      roles: ['admin'],
      password: 'long-enough-1',
    });
    const secondAgent = await t.signIn('second-admin@fernhollow.test', 'long-enough-1');
    const me = await admin.get('/api/auth/me');
    // The demo admin is deactivated by the second one: the second is now the only active admin.
    expect((await secondAgent.post(`/api/people/${me.body.person.id}/deactivate`)).status).toBe(200);
    const demote = await secondAgent.patch(`/api/people/${second.body.person.id}`).send({ roles: ['sales'] });
    expect(demote.status).toBe(409);
    expect(demote.body.error.code).toBe('last_admin');
    expect((await secondAgent.post(`/api/people/${me.body.person.id}/reactivate`)).status).toBe(200);
    admin = await t.agent('admin', { fresh: true });
    expect((await admin.post(`/api/people/${second.body.person.id}/deactivate`)).status).toBe(200);
  });

  it('an unknown person answers 404', async () => {
    expect((await admin.post('/api/people/nobody-here/deactivate')).status).toBe(404);
    expect((await admin.post('/api/people/nobody-here/reset-password')).status).toBe(404);
  });
});

describe('reset a password', () => {
  it('answers a generated password once; the old one stops working and sessions end', async () => {
    const p = await newPerson();
    const res = await admin.post(`/api/people/${p.id}/reset-password`);
    expect(res.status).toBe(200);
    const password = res.body.password as string;
    expect(password).toMatch(/^[a-z2-9]{4}(-[a-z2-9]{4}){3}$/);
    expect((await p.agent.get('/api/auth/me')).status).toBe(401);
    expect((await signIn(p.email, 'first-password-1')).status).toBe(401);
    expect((await signIn(p.email, password)).status).toBe(200);
    // Never stored in clear, never logged.
    const [row] = await t.ctx.db.select().from(people).where(eq(people.id, p.id));
    expect(row.passwordHash).not.toContain(password);
    const events = await t.ctx.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.subject, `person:${p.id}`));
    expect(events.map((e) => e.action)).toContain('person.password_reset');
    expect(JSON.stringify(events)).not.toContain(password);
    expect((await admin.get('/api/people')).text).not.toContain(password);
  });

  it('generates different passwords from an even alphabet', () => {
    const seen = new Set(Array.from({ length: 200 }, generatePassword));
    expect(seen.size).toBe(200);
    for (const password of seen) expect(password).not.toMatch(/[01ilo]/);
  });
});

describe('rename', () => {
  it('trims the new name, refuses a blank one and logs the change', async () => {
    const p = await newPerson();
    const res = await admin.patch(`/api/people/${p.id}`).send({ name: '  Wren Holloway ' });
    expect(res.body.person.name).toBe('Wren Holloway');
    const blank = await admin.patch(`/api/people/${p.id}`).send({ name: '   ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.message).toBe('Give the person a name.');
    const events = await t.ctx.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.subject, `person:${p.id}`));
    expect(events.map((e) => e.action)).toContain('person.renamed');
  });
});

describe('change my own password', () => {
  it('needs the current password and at least 10 characters; other sessions end, this one stays', async () => {
    const p = await newPerson();
    const other = await t.signIn(p.email, 'first-password-1');

    const wrong = await p.agent
      .post('/api/auth/password')
      .send({ currentPassword: 'not-it-at-all', newPassword: 'second-password-2' });
    expect(wrong.status).toBe(400);
    expect(wrong.body.error.code).toBe('wrong_password');
    expect(wrong.body.error.details[0].path).toBe('currentPassword');

    const short = await p.agent
      .post('/api/auth/password')
      .send({ currentPassword: 'first-password-1', newPassword: 'short' });
    expect(short.status).toBe(400);
    expect(short.body.error.message).toBe('The password needs at least 10 characters.');

    const same = await p.agent
      .post('/api/auth/password')
      .send({ currentPassword: 'first-password-1', newPassword: 'first-password-1' });
    expect(same.status).toBe(400);

    const ok = await p.agent
      .post('/api/auth/password')
      .send({ currentPassword: 'first-password-1', newPassword: 'second-password-2' });
    expect(ok.status).toBe(204);
    expect((await p.agent.get('/api/auth/me')).status).toBe(200);
    expect((await other.get('/api/auth/me')).status).toBe(401);
    expect((await signIn(p.email, 'first-password-1')).status).toBe(401);
    expect((await signIn(p.email, 'second-password-2')).status).toBe(200);
  });

  it('is refused when signed out', async () => {
    const res = await supertest(t.app)
      .post('/api/auth/password')
      .set('Origin', TEST_ORIGIN)
      .send({ currentPassword: 'x', newPassword: 'yyyyyyyyyyyy' });
    expect(res.status).toBe(401);
  });
});
