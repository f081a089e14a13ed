/**
 * Notes on workflow steps and the e-mails they send: a note is optional on submit, approve, publish and retire and
 * required to send back; it is kept with the revision and in the family's history and goes out with the mail.
 * Publishing and retiring tell the family's designer and the catalogue managers. Links in mail are absolute.
 * Who is told what is our own product rule (no outside source); absolute links are what RFC 3986 §4.3 calls an
 * absolute URI (scheme and authority), which mail readers need because a message has no base address.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { MailMessagesResponse } from '../shared/schemas/mail';
import type { Family } from '../shared/schemas/family';
import type { FamilyAuditEvent } from '../shared/schemas/review';
import { linkBase } from '../server/mail/linkBase';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { startMail, stopMail } from '../server/services/mailService';
import { acknowledgeAll, computeNow, createTestFamily } from './familiesFixtures';
import { useTestApp, TEST_ORIGIN } from './setup/testApp';

const t = useTestApp();
beforeAll(async () => {
  await startMail(t.ctx, { env: { SMTP_PORT: 0, MAIL_FROM: 'Nestwright <no-reply@fernhollow.test>' } });
  // A second catalogue manager, so the one who publishes is not the only one to be told.
  const res = await (await t.agent('admin')).post('/api/people').send({
    email: 'wren@fernhollow.test',
    name: 'Wren Ashby',
    roles: ['catalogue_manager'],
    password: 'long-enough-1',
  });
  expect(res.status).toBe(201);
});
afterAll(async () => {
  await stopMail(t.ctx);
  await familyJobs(t.ctx).close();
});

async function until<T>(read: () => Promise<T>, done: (value: T) => boolean, timeoutMs = 30_000): Promise<T> {
  const started = Date.now();
  for (;;) {
    const value = await read();
    if (done(value) || Date.now() - started > timeoutMs) return value;
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}

async function mailbox(): Promise<MailMessagesResponse> {
  return (await (await t.agent('admin')).get('/api/mail/messages')).body as MailMessagesResponse;
}

/** The captured message with this subject (waits for delivery). */
async function message(subject: string): Promise<MailMessagesResponse['messages'][number]> {
  const box = await until(mailbox, (b) => b.messages.some((m) => m.subject === subject));
  const found = box.messages.find((m) => m.subject === subject);
  expect(found, `a captured message "${subject}"`).toBeDefined();
  return found!;
}

async function step(role: 'designer' | 'catalogue_manager', id: string, action: string, body: object = {}) {
  return (await t.agent(role)).post(`/api/families/${id}/${action}`).send(body);
}

// Many workflow steps and mail round trips on a shared machine: two minutes per test.
describe('notes on workflow steps', { timeout: 120_000 }, () => {
  it('keeps each note with the revision and in the history, and sends it with an absolute link', async () => {
    const family = await createTestFamily(t);
    await computeNow(t, family.id);
    await acknowledgeAll(t, family.id);
    const title = `Test Gable (${family.code}) revision 1`;
    const link = `${TEST_ORIGIN}/families/${family.id}`;

    expect((await step('designer', family.id, 'submit', { comment: '  Ready for the spring list.  ' })).status).toBe(
      200,
    );
    const submitted = await message(`Review requested: ${title}`);
    expect(submitted.to.sort()).toEqual(['tobias@fernhollow.test', 'wren@fernhollow.test']);
    expect(submitted.text).toContain('Note from Maren Hale:\nReady for the spring list.');
    expect(submitted.text).toContain(`Review it: ${link}`);

    // Send back needs a note, in words for people.
    const bare = await step('catalogue_manager', family.id, 'return', { comments: '   ' });
    expect(bare.status).toBe(400);
    expect(bare.body.error.message).toBe('Say what should change before the family can be approved.');

    const approved = await step('catalogue_manager', family.id, 'approve', { comment: 'Photos are clear.' });
    expect(approved.status).toBe(200);
    const approveMail = await message(`Approved: ${title}`);
    expect(approveMail.to).toEqual(['maren@fernhollow.test']);
    expect(approveMail.text).toContain('Photos are clear.');

    // Publishing tells the designer and the other catalogue managers, with the note.
    expect((await step('catalogue_manager', family.id, 'publish', { comment: 'For the March mailing.' })).status).toBe(
      200,
    );
    const published = await message(`Published: ${title}`);
    expect(published.to.sort()).toEqual(['maren@fernhollow.test', 'wren@fernhollow.test']);
    expect(published.text).toContain('Tobias');
    expect(published.text).toContain('For the March mailing.');
    expect(published.text).toContain(`Open it: ${link}`);

    // Retiring without a note is fine; it tells the same people.
    const retired = await step('catalogue_manager', family.id, 'retire', {});
    expect(retired.status).toBe(200);
    const retireMail = await message(`Retired: ${title}`);
    expect(retireMail.to.sort()).toEqual(['maren@fernhollow.test', 'wren@fernhollow.test']);
    expect(retireMail.text).toContain('left the catalogue');
    expect(retireMail.text).not.toContain('Note from');

    // Every link in every one of these messages is absolute.
    const box = await mailbox();
    for (const m of box.messages.filter((x) => x.subject.endsWith(title)))
      for (const line of m.text.split('\n').filter((l) => l.includes('/families/')))
        expect(line).toMatch(/https?:\/\/[^/\s]+\/families\//);

    const current = (await (await t.agent('catalogue_manager')).get(`/api/families/${family.id}`)).body
      .family as Family;
    expect(current.comments.map((c) => [c.action, c.text])).toEqual(
      expect.arrayContaining([
        ['submit', 'Ready for the spring list.'],
        ['approve', 'Photos are clear.'],
        ['publish', 'For the March mailing.'],
      ]),
    );
    const audit = (await (await t.agent('catalogue_manager')).get(`/api/families/${family.id}/audit`)).body
      .events as FamilyAuditEvent[];
    const notes = Object.fromEntries(audit.map((e) => [e.action, e.details.comment]));
    expect(notes).toMatchObject({
      'family.submitted': 'Ready for the spring list.',
      'family.approved': 'Photos are clear.',
      'family.published': 'For the March mailing.',
    });
    expect(notes['family.retired']).toBeUndefined();
  });

  it('leaves a deactivated catalogue manager out of the mail', async () => {
    const admin = await t.agent('admin');
    const people = (await admin.get('/api/people')).body.people as { id: string; email: string }[];
    const wren = people.find((p) => p.email === 'wren@fernhollow.test')!;
    expect((await admin.post(`/api/people/${wren.id}/deactivate`)).status).toBe(200);
    const family = await createTestFamily(t);
    await computeNow(t, family.id);
    await acknowledgeAll(t, family.id);
    expect((await step('designer', family.id, 'submit')).status).toBe(200);
    const submitted = await message(`Review requested: Test Gable (${family.code}) revision 1`);
    expect(submitted.to).toEqual(['tobias@fernhollow.test']);
    expect((await admin.post(`/api/people/${wren.id}/reactivate`)).status).toBe(200);
  });
});

describe('linkBase()', () => {
  const request = (host: string | undefined, protocol = 'http') => ({
    protocol,
    get: ((name: string) => (name.toLowerCase() === 'host' ? host : undefined)) as never,
  });
  it('prefers PUBLIC_ORIGIN, without a trailing slash', () => {
    expect(linkBase({ PUBLIC_ORIGIN: 'https://nest.example.test/', PORT: 3000 }, request('other.test'))).toBe(
      'https://nest.example.test',
    );
  });
  it('falls back to the address the request came to, then to localhost and the port', () => {
    expect(linkBase({ PORT: 3000 }, request('studio.example.test:8080', 'https'))).toBe(
      'https://studio.example.test:8080',
    );
    expect(linkBase({ PORT: 3320 })).toBe('http://localhost:3320');
    // A Host header that is not a host name is not copied into mail.
    expect(linkBase({ PORT: 3320 }, request('evil.test/<script>'))).toBe('http://localhost:3320');
  });
});
