/**
 * The in-process memory of valid sessions never outlives what the database says: a role change, a deactivation and a
 * sign-out are seen by the very next request of that session, even right after a request that was answered from the
 * memory (common practice, no source: revocation takes effect at once in the process that made it).
 */
import { describe, expect, it } from 'vitest';
import type { StudioPerson } from '../shared/schemas/auth';
import { DEMO_PASSWORD } from '../server/db/seedDemo';
import { useTestApp } from './setup/testApp';

const t = useTestApp();

async function personId(email: string): Promise<string> {
  const people = (await (await t.agent('admin')).get('/api/people')).body.people as StudioPerson[];
  const person = people.find((p) => p.email === email);
  if (!person) throw new Error(`no ${email}`);
  return person.id;
}

describe('session memory', () => {
  it('sees a role change on the next request', async () => {
    const sales = await t.signIn('ada@fernhollow.test', DEMO_PASSWORD);
    expect((await sales.get('/api/catalogue')).status).toBe(200);
    expect((await sales.get('/api/catalogue')).status).toBe(200);
    const id = await personId('ada@fernhollow.test');
    const admin = await t.agent('admin');
    expect((await admin.patch(`/api/people/${id}`).send({ roles: ['operations'] })).status).toBe(200);
    expect((await sales.get('/api/catalogue')).status).toBe(403);
    expect((await admin.patch(`/api/people/${id}`).send({ roles: ['sales'] })).status).toBe(200);
    expect((await sales.get('/api/catalogue')).status).toBe(200);
  });

  it('turns a deactivated person away on the next request', async () => {
    const manager = await t.signIn('tobias@fernhollow.test', DEMO_PASSWORD);
    expect((await manager.get('/api/catalogue')).status).toBe(200);
    const id = await personId('tobias@fernhollow.test');
    const admin = await t.agent('admin');
    expect((await admin.post(`/api/people/${id}/deactivate`).send({})).status).toBe(200);
    expect((await manager.get('/api/catalogue')).status).toBe(401);
    expect((await admin.post(`/api/people/${id}/reactivate`).send({})).status).toBe(200);
  });

  it('turns a signed-out session away on the next request, even with the old cookie', async () => {
    const designer = await t.agent(null, { fresh: true });
    const signIn = await designer
      .post('/api/auth/sign-in')
      .send({ email: 'maren@fernhollow.test', password: DEMO_PASSWORD });
    expect(signIn.status).toBe(200);
    const cookie = ([signIn.headers['set-cookie']].flat()[0] as string).split(';')[0];
    const other = await t.agent(null, { fresh: true });
    expect((await other.get('/api/catalogue').set('Cookie', cookie)).status).toBe(200);
    expect((await designer.post('/api/auth/sign-out').send({})).status).toBe(204);
    expect((await other.get('/api/catalogue').set('Cookie', cookie)).status).toBe(401);
  });
});
