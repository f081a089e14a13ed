/**
 * The home page's to-do counts: each role sees its own counts, and they move with the work (a new draft, a
 * submission, a send-back, a failed e-mail, a new quote). Which counts each role gets is our own product rule (no
 * outside source); each count is checked against the list it summarises, read through its own API.
 */
import { afterAll, describe, expect, it } from 'vitest';
import type { Role } from '../shared/schemas/auth';
import type { TodoItem } from '../shared/schemas/todo';
import { familyJobs } from '../server/jobs/FamilyJobRunner';
import { queueMail } from '../server/mail/queueMail';
import { mailOutbox } from '../server/db/schema';
import { eq } from 'drizzle-orm';
import { familyInState } from './familiesFixtures';
import { ensureSalesFixture, FIXTURE_SKUS } from './salesFixtures';
import { useTestApp } from './setup/testApp';

const t = useTestApp();
afterAll(async () => {
  await familyJobs(t.ctx).close();
});

async function todo(role: Role): Promise<Record<string, TodoItem>> {
  const res = await (await t.agent(role)).get('/api/home/todo');
  expect(res.status).toBe(200);
  return Object.fromEntries((res.body.items as TodoItem[]).map((item) => [item.key, item]));
}

describe('to-do counts on the home page', { timeout: 180_000 }, () => {
  it('gives each role only its own counts, each with a link to its screen', async () => {
    expect(Object.keys(await todo('designer'))).toEqual(['designer.sent_back', 'designer.drafts']);
    expect(Object.keys(await todo('catalogue_manager'))).toEqual(['catalogue_manager.in_review']);
    expect(Object.keys(await todo('sales'))).toEqual(['sales.open_quotes']);
    expect(Object.keys(await todo('operations'))).toEqual(['operations.to_send', 'operations.exceptions']);
    const admin = await todo('admin');
    expect(Object.keys(admin)).toEqual(['admin.failed_mail']);
    expect(admin['admin.failed_mail'].path).toBe('/admin/mail');
    expect((await (await t.agent(null)).get('/api/home/todo')).status).toBe(401);
  });

  it('moves with drafts, submissions and send-backs', async () => {
    const before = { designer: await todo('designer'), manager: await todo('catalogue_manager') };
    const family = await familyInState(t, 'in_review');
    const inReview = await todo('catalogue_manager');
    expect(inReview['catalogue_manager.in_review'].count).toBe(before.manager['catalogue_manager.in_review'].count + 1);
    // The count equals what the review queue lists as waiting.
    const listed = (await (await t.agent('catalogue_manager')).get('/api/families?state=in_review')).body;
    expect(inReview['catalogue_manager.in_review'].count).toBe(listed.families.length);

    const back = await (
      await t.agent('catalogue_manager')
    )
      .post(`/api/families/${family.id}/return`)
      .send({ comments: 'Add a photo of the drainage holes.' });
    expect(back.status).toBe(200);
    const after = await todo('designer');
    expect(after['designer.sent_back'].count).toBe(before.designer['designer.sent_back'].count + 1);
    expect(after['designer.drafts'].count).toBe(before.designer['designer.drafts'].count + 1);
    expect((await todo('catalogue_manager'))['catalogue_manager.in_review'].count).toBe(
      before.manager['catalogue_manager.in_review'].count,
    );
  });

  it('counts failed e-mails for the admin and open quotes for sales', async () => {
    const failedBefore = (await todo('admin'))['admin.failed_mail'].count;
    await queueMail(t.ctx.db, { to: ['joss@fernhollow.test'], subject: 'Failed probe', text: 'probe' });
    await t.ctx.db.update(mailOutbox).set({ status: 'failed' }).where(eq(mailOutbox.subject, 'Failed probe'));
    expect((await todo('admin'))['admin.failed_mail'].count).toBe(failedBefore + 1);

    await ensureSalesFixture(t.ctx.db);
    const quotesBefore = (await todo('sales'))['sales.open_quotes'].count;
    const created = await (await t.agent('sales')).post('/api/quotes').send({
      lines: [{ sku: FIXTURE_SKUS[0], quantity: 3 }],
      deliveryDate: '2099-01-31',
      customerName: 'To-do probe',
    });
    expect(created.status).toBe(201);
    expect((await todo('sales'))['sales.open_quotes'].count).toBe(quotesBefore + 1);
  });

  it('counts farm exceptions as the exceptions screen lists them', async () => {
    const exceptions = (await (await t.agent('operations')).get('/api/farm/exceptions')).body;
    expect((await todo('operations'))['operations.exceptions'].count).toBe(
      exceptions.held.length + exceptions.waiting.length,
    );
  });
});
