/**
 * E-mail: workflow messages go through the outbox over SMTP (nodemailer) to the local fake SMTP server
 * (smtp-server), which captures them; when the SMTP server is down the message stays queued and is retried with
 * backoff until it is delivered. Who is told what is our own product rule (issue 5): no outside source.
 */
import { createServer } from 'node:net';
import { afterAll, afterEach, describe, expect, it } from 'vitest';
import type { MailMessagesResponse } from '../shared/schemas/mail';
import { FakeSmtpServer } from '../server/mail/FakeSmtpServer';
import { MailSender } from '../server/mail/MailSender';
import { parseCapturedMail } from '../server/mail/parseCapturedMail';
import { queueMail } from '../server/mail/queueMail';
import { mailRuntime, startMail, stopMail } from '../server/services/mailService';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { familyInState } from './familiesFixtures';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
afterEach(async () => {
  await stopMail(t.ctx);
});
afterAll(async () => {
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
  const res = await (await t.agent('admin')).get('/api/mail/messages');
  expect(res.status).toBe(200);
  return res.body;
}

/** A TCP port with nothing listening on it (bound, read, released). */
async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise<void>((resolve) => server.close(() => resolve()));
  return port;
}

// A family computed and two mail round trips on a shared machine: two minutes.
describe('workflow e-mail through the fake SMTP server', { timeout: 120_000 }, () => {
  it('tells reviewers about a submit and the designer about a return, and lists the messages for the admin', async () => {
    const runtime = await startMail(t.ctx, {
      env: { SMTP_PORT: 0, MAIL_FROM: 'Nestwright <no-reply@fernhollow.test>' },
    });
    expect(runtime.smtp).not.toBeNull();
    const family = await familyInState(t, 'in_review');
    const title = `Test Gable (${family.code}) revision 1`;
    let box = await until(mailbox, (b) => b.messages.some((m) => m.subject === `Review requested: ${title}`));
    const review = box.messages.find((m) => m.subject === `Review requested: ${title}`);
    expect(review?.to).toEqual(['tobias@fernhollow.test']);
    expect(review?.from).toBe('no-reply@fernhollow.test');
    expect(review?.text).toContain('Maren Hale submitted');
    expect(review?.text).toContain(`/families/${family.id}`);

    const back = await (
      await t.agent('catalogue_manager')
    )
      .post(`/api/families/${family.id}/return`)
      .send({ comments: 'Please show the drainage holes in a photo — thanks!' });
    expect(back.status).toBe(200);
    // The outbox row is marked sent just after the SMTP server accepted the message: wait for both.
    box = await until(
      mailbox,
      (b) =>
        b.messages.some((m) => m.subject === `Sent back: ${title}`) &&
        b.outbox.some((o) => o.subject === `Sent back: ${title}` && o.status === 'sent'),
    );
    const returned = box.messages.find((m) => m.subject === `Sent back: ${title}`);
    expect(returned?.to).toEqual(['maren@fernhollow.test']);
    // non-ASCII text survives the SMTP round trip (quoted-printable decoding)
    expect(returned?.text).toContain('Please show the drainage holes in a photo — thanks!');
    const queued = box.outbox.find((o) => o.subject === `Sent back: ${title}`);
    expect(queued?.status).toBe('sent');
    expect(queued?.attempts).toBe(1);
  });

  it('answers 403 to everyone but the admin', async () => {
    for (const role of ['designer', 'catalogue_manager', 'sales'] as const) {
      expect((await (await t.agent(role)).get('/api/mail/messages')).status).toBe(403);
    }
  });
});

describe('when the SMTP server is down', () => {
  it('keeps the workflow step, queues the message and delivers it once the server is back', async () => {
    const port = await freePort();
    await startMail(t.ctx, {
      env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: port, MAIL_FROM: 'no-reply@fernhollow.test' },
      retry: { baseDelayMs: 100, maxDelayMs: 400 },
    });
    const family = await familyInState(t, 'in_review');
    const subject = `Review requested: Test Gable (${family.code}) revision 1`;
    // The submit itself succeeded while no SMTP server listened.
    expect(family.state).toBe('in_review');
    let box = await until(mailbox, (b) => (b.outbox.find((o) => o.subject === subject)?.attempts ?? 0) >= 2);
    let entry = box.outbox.find((o) => o.subject === subject)!;
    expect(entry.status).toBe('pending');
    expect(entry.attempts).toBeGreaterThanOrEqual(2);
    expect(entry.lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(entry.nextAttemptAt).not.toBeNull();
    expect(box.messages.some((m) => m.subject === subject)).toBe(false);

    const smtp = new FakeSmtpServer(t.ctx.db);
    await smtp.listen(port);
    try {
      box = await until(mailbox, (b) => b.outbox.find((o) => o.subject === subject)?.status === 'sent');
      entry = box.outbox.find((o) => o.subject === subject)!;
      expect(entry.status).toBe('sent');
      expect(entry.lastError).toBeNull();
      expect(box.messages.filter((m) => m.subject === subject)).toHaveLength(1);
    } finally {
      await mailRuntime(t.ctx)?.sender.stop();
      await smtp.close();
    }
  });

  it('backs off exponentially up to the cap and gives up after the last attempt', async () => {
    const port = await freePort();
    const sender = new MailSender(t.ctx.db, {
      host: '127.0.0.1',
      port,
      from: 'no-reply@fernhollow.test',
      baseDelayMs: 1000,
      maxDelayMs: 8000,
      maxAttempts: 2,
    });
    // common practice, no source: doubling from the base, capped
    expect([1, 2, 3, 4, 5, 6].map((n) => sender.retryDelayMs(n))).toEqual([1000, 2000, 4000, 8000, 8000, 8000]);
    const subject = `Give-up probe ${crypto.randomUUID()}`;
    await queueMail(t.ctx.db, { to: ['joss@fernhollow.test'], subject, text: 'probe' });
    const before = Date.now();
    await sender.deliverDue();
    const after = Date.now();
    let entry = (await mailbox()).outbox.find((o) => o.subject === subject)!;
    expect(entry).toMatchObject({ status: 'pending', attempts: 1 });
    // the failed attempt happened between `before` and `after`; the next one is the base delay later
    const next = Date.parse(entry.nextAttemptAt!);
    expect(next).toBeGreaterThanOrEqual(before + 1000);
    expect(next).toBeLessThanOrEqual(after + 1000);
    // A second in the past: PostgreSQL's now() carries microseconds, the sender compares with a millisecond clock,
    // so "now()" itself can still lie in the sender's future within the same millisecond.
    await t.ctx.pg.query(`update mail_outbox set next_attempt_at = now() - interval '1 second' where subject = $1`, [
      subject,
    ]);
    await sender.deliverDue();
    entry = (await mailbox()).outbox.find((o) => o.subject === subject)!;
    expect(entry).toMatchObject({ status: 'failed', attempts: 2 });
    await sender.stop();
  });
});

describe('reading captured messages', () => {
  it('decodes quoted-printable bodies and encoded subjects', () => {
    const raw = [
      'From: a@b.test',
      'Subject: =?UTF-8?Q?Sent_back:_Caf=C3=A9_box?=',
      'Content-Transfer-Encoding: quoted-printable',
      '',
      'Line one =E2=80=94 with a dash and a soft=',
      ' break.',
    ].join('\r\n');
    expect(parseCapturedMail(raw)).toEqual({
      subject: 'Sent back: Café box',
      text: 'Line one — with a dash and a soft break.',
    });
  });
});
