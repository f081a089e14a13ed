/**
 * API conventions: bad input answers 400 naming the field, malformed JSON 400 `bad_json`, oversized bodies 413,
 * unknown API paths 404, unexpected failures 500 without internals, all in the one error shape.
 * The limits (254-character e-mail, 120-character name) come from shared/schemas/auth.ts; RFC 5321 via common
 * practice caps an address at 254 characters.
 */
import express from 'express';
import { mkdir, mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import supertest from 'supertest';
import { beforeAll, describe, expect, it } from 'vitest';
import { ApiErrorSchema } from '../shared/schemas/error';
import { createApp } from '../server/app';
import { errorHandler } from '../server/http/errorHandler';
import { useTestApp, type TestAgent } from './setup/testApp';

const t = useTestApp();
let admin: TestAgent;
beforeAll(async () => {
  admin = await t.agent('admin');
});

const validPerson = {
  email: 'newcomer@fernhollow.test',
  name: 'New Comer',
  roles: ['designer'],
  password: 'a-long-enough-password',
};

/** Asserts the one error shape and returns the error. */
function errorOf(res: { body: unknown }) {
  const parsed = ApiErrorSchema.safeParse(res.body);
  expect(parsed.success, JSON.stringify(res.body)).toBe(true);
  return parsed.data!.error;
}

describe('health', () => {
  it('answers { ok: true } without signing in', async () => {
    const res = await supertest(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ ok: true });
    expect(res.headers['cache-control']).toBe('no-store');
  });
});

describe('bad input', () => {
  it('malformed JSON -> 400 bad_json', async () => {
    const res = await admin.post('/api/people').set('Content-Type', 'application/json').send('{"email": ');
    expect(res.status).toBe(400);
    expect(errorOf(res).code).toBe('bad_json');
  });

  it('malformed JSON on sign-in -> 400 bad_json, not a rate-limit count or a 500', async () => {
    const res = await (
      await t.agent(null)
    )
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send('nope');
    expect(res.status).toBe(400);
    expect(errorOf(res).code).toBe('bad_json');
  });

  const cases: Array<{ label: string; body: unknown; field: string }> = [
    { label: 'missing e-mail', body: { ...validPerson, email: undefined }, field: 'email' },
    { label: 'missing roles', body: { ...validPerson, roles: undefined }, field: 'roles' },
    { label: 'e-mail of the wrong type', body: { ...validPerson, email: 42 }, field: 'email' },
    { label: 'roles of the wrong type', body: { ...validPerson, roles: 'designer' }, field: 'roles' },
    { label: 'empty roles', body: { ...validPerson, roles: [] }, field: 'roles' },
    { label: 'unknown role', body: { ...validPerson, roles: ['designer', 'owner'] }, field: 'roles.1' },
    { label: 'over-long name', body: { ...validPerson, name: 'n'.repeat(121) }, field: 'name' },
    { label: 'over-long e-mail', body: { ...validPerson, email: `${'a'.repeat(250)}@x.test` }, field: 'email' },
    { label: 'over-long password', body: { ...validPerson, password: 'p'.repeat(257) }, field: 'password' },
    { label: 'short password', body: { ...validPerson, password: 'short' }, field: 'password' },
    { label: 'not an e-mail', body: { ...validPerson, email: 'maren at fernhollow' }, field: 'email' },
    { label: 'body is an array', body: [validPerson], field: 'body' },
  ];
  it.each(cases)('POST /api/people with $label -> 400 naming $field', async ({ body, field }) => {
    const res = await admin.post('/api/people').send(body as object);
    expect(res.status).toBe(400);
    const error = errorOf(res);
    expect(error.code).toBe('bad_request');
    // Written for people: no field key, no validation-library wording; the field is named in details.
    expect(error.message, error.message).not.toMatch(/^[a-z][a-zA-Z.0-9]*: |expected|Invalid input/);
    expect(error.details).toEqual(
      expect.arrayContaining([expect.objectContaining({ path: field === 'body' ? '' : field })]),
    );
  });

  it('PATCH /api/people/:id with an unknown role -> 400 naming roles.0', async () => {
    const people = await admin.get('/api/people');
    const res = await admin.patch(`/api/people/${people.body.people[0].id}`).send({ roles: ['gardener'] });
    expect(res.status).toBe(400);
    expect(errorOf(res).message).toBe('Choose a role: Designer, Catalogue manager, Sales, Operations or Admin.');
    expect((errorOf(res).details as Array<{ path: string }>)[0].path).toBe('roles.0');
  });

  it('sign-in without a JSON body -> 400, not a crash', async () => {
    const res = await (await t.agent(null)).post('/api/auth/sign-in').set('Content-Type', 'text/plain').send('hello');
    expect(res.status).toBe(400);
    expect(errorOf(res).code).toBe('bad_request');
  });

  it('a body over 1 MB -> 413', async () => {
    const res = await admin.post('/api/people').send({ ...validPerson, name: 'x'.repeat(1_100_000) });
    expect(res.status).toBe(413);
    expect(errorOf(res).code).toBe('payload_too_large');
  });
});

describe('not found and failures', () => {
  it('unknown API path -> 404 in the error shape, also for POST', async () => {
    for (const res of [await admin.get('/api/no-such-thing'), await admin.post('/api/no/such').send({})]) {
      expect(res.status).toBe(404);
      expect(errorOf(res).code).toBe('not_found');
    }
  });

  it('PATCH of an unknown person -> 404', async () => {
    const res = await admin.patch('/api/people/not-a-person').send({ name: 'Nobody' });
    expect(res.status).toBe(404);
    expect(errorOf(res).code).toBe('not_found');
  });

  it('an unexpected error -> 500 with a generic message, no stack trace, logged on the server', async () => {
    const logged: unknown[] = [];
    const app = express();
    app.get('/boom', async () => {
      throw new Error('secret internals at /srv/db.ts:42');
    });
    app.use(errorHandler((err) => logged.push(err)));
    const res = await supertest(app).get('/boom');
    expect(res.status).toBe(500);
    expect(errorOf(res)).toEqual({ code: 'internal', message: expect.any(String) });
    expect(res.text).not.toMatch(/secret|\.ts:|at /);
    expect(logged).toHaveLength(1);
  });
});

describe('serving the built client', () => {
  it('serves files, index.html for pages, 404 for missing files, and keeps /api in the error shape', async () => {
    const clientDir = await mkdtemp(join(tmpdir(), 'nestwright-client-'));
    try {
      await mkdir(join(clientDir, 'assets'));
      await writeFile(join(clientDir, 'index.html'), '<!doctype html><title>Nestwright</title>');
      await writeFile(join(clientDir, 'assets', 'main-abc123.js'), 'console.log(1)');
      const app = createApp(t.ctx, { clientDir });
      for (const page of ['/', '/designs/42', '/admin/people']) {
        const res = await supertest(app).get(page);
        expect(res.status, page).toBe(200);
        expect(res.text).toContain('<title>Nestwright</title>');
        expect(res.headers['cache-control']).toBe('no-cache');
      }
      const asset = await supertest(app).get('/assets/main-abc123.js');
      expect(asset.status).toBe(200);
      expect(asset.headers['cache-control']).toContain('immutable');
      expect((await supertest(app).get('/assets/missing-000.js')).status).toBe(404);
      const api = await supertest(app).get('/api/nothing-here');
      expect(api.status).toBe(404);
      expect(errorOf(api).code).toBe('not_found');
    } finally {
      await rm(clientDir, { recursive: true, force: true });
    }
  });
});
