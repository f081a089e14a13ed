/**
 * The Failed jobs screen (/admin/jobs) in Chromium against the real server. Two jobs fail into the dead-letter list:
 * one through the job queue itself (a job type of this test that refuses every attempt; this version does not know it,
 * so it is listed by its queue name and the admin can only discard it), and one "Closing abandoned checkouts" job recorded the way a worker
 * records its last failed attempt, which the admin runs again. Each shows its title, reason and attempts; after
 * each action it moves to "Handled" with who did what. Other roles are sent away. axe-core finds no serious or
 * critical WCAG 2.x A/AA violation with the list filled, at 1440 and 390 px. Screenshots at 1440, 1024 and 390 px
 * go to /tmp/nestwright-e2e/admin-jobs.
 * source: Web Content Accessibility Guidelines (WCAG) 2.2, W3C, 2023; axe-core rule impacts, Deque Systems, 2024.
 * Access rules and the retry/discard flow are the product's own (no outside source).
 */
import { mkdirSync } from 'node:fs';
import AxeBuilder from '@axe-core/playwright';
import { eq } from 'drizzle-orm';
import type { Page } from 'playwright-core';
import { z } from 'zod';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditEvents, jobDeadLetters } from '../../server/db/schema';
import { defineJob } from '../../server/jobs/JobQueue';
import { startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e/admin-jobs';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E({ viewport: { width: 1440, height: 960 } });
}, 300_000);

afterAll(async () => {
  await e2e?.close();
});

/** A job type only this test knows: every attempt fails with the same reason. */
const refusingJob = defineJob({
  name: 'test.label-printer',
  data: z.object({ parcel: z.string() }),
  retry: { limit: 1, delaySec: 0.1, backoff: false },
  timeLimitSec: 10,
  async handler() {
    throw new Error('the label printer at 10.0.0.9 did not answer');
  },
});

/** Serious and critical axe violations on the page as it is now, one line each. */
async function axeProblems(page: Page): Promise<string[]> {
  const result = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return result.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

async function until(check: () => Promise<boolean>, timeoutMs = 30_000): Promise<void> {
  const end = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > end) throw new Error('condition not met in time');
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

describe('Failed jobs screen', () => {
  it('lists failed jobs for the admin, who runs one again and discards the other', async () => {
    const { ctx } = e2e.server;
    // 1. A job fails every attempt on the queue and lands in the dead-letter list.
    await ctx.jobs.work([refusingJob]);
    const jobId = await ctx.jobs.send(refusingJob, { parcel: 'NW-1042' });
    const deadOf = (id: string) => ctx.db.select().from(jobDeadLetters).where(eq(jobDeadLetters.jobId, id));
    await until(async () => (await deadOf(jobId!)).length === 1);
    const [refused] = await deadOf(jobId!);
    expect(refused).toMatchObject({ attempts: 2, error: 'the label printer at 10.0.0.9 did not answer' });
    // 2. A job type of this version, recorded as a worker records its last failed attempt.
    const [expiry] = await ctx.db
      .insert(jobDeadLetters)
      .values({
        jobName: 'checkout.expire',
        jobId: crypto.randomUUID(),
        data: {},
        error: 'no payment service is known yet: set PAYMENT_SECRET_KEY, or start an API process',
        attempts: 4,
      })
      .returning();

    // Other roles do not get the screen.
    const operations = await e2e.newPage();
    await e2e.signInAs(operations, 'operations');
    await operations.goto('/admin/jobs');
    await operations.waitForURL((url) => url.pathname !== '/admin/jobs');
    expect(await operations.getByRole('heading', { name: 'Failed jobs' }).count()).toBe(0);

    const page = await e2e.newPage({ viewport: { width: 1440, height: 960 } });
    await e2e.signInAs(page, 'admin');
    await page.goto('/admin/jobs');
    await page.getByRole('heading', { name: 'Failed jobs', level: 1 }).waitFor();
    const items = page.getByTestId('dead-letter');
    await items.first().waitFor();
    await expect(page.getByRole('radio', { name: 'Waiting (2)' }).count()).resolves.toBe(1);

    const refusedItem = items.filter({ hasText: 'test.label-printer' });
    await expect(refusedItem.textContent()).resolves.toContain('the label printer at 10.0.0.9 did not answer');
    await expect(refusedItem.locator('dd.nw-figure').textContent()).resolves.toBe('2');
    await expect(refusedItem.textContent()).resolves.toContain('it can only be discarded');
    expect(await refusedItem.getByTestId('dead-letter-retry').isDisabled()).toBe(true);
    const expiryItem = items.filter({ hasText: 'Closing abandoned checkouts' });
    await expect(expiryItem.textContent()).resolves.toContain('no payment service is known yet');
    await expect(expiryItem.locator('dd.nw-figure').textContent()).resolves.toBe('4');

    expect(await axeProblems(page)).toEqual([]);
    for (const width of [1440, 1024, 390]) {
      await page.setViewportSize({ width, height: width === 390 ? 844 : 960 });
      await page.screenshot({ path: `${SHOTS}/waiting-${width}.png`, fullPage: true });
      if (width === 390) expect(await axeProblems(page)).toEqual([]);
    }
    await page.setViewportSize({ width: 1440, height: 960 });

    // Run the checkout job again: queued as a new job, the dead letter is handled.
    await expiryItem.getByTestId('dead-letter-retry').click();
    await page.getByText('"Closing abandoned checkouts" is queued again.').waitFor();
    await until(async () => (await items.count()) === 1);
    const [retried] = await ctx.db.select().from(jobDeadLetters).where(eq(jobDeadLetters.id, expiry.id));
    expect(retried.resolution).toBe('retried');

    // Discard the job this version cannot run: the confirmation first.
    await refusedItem.getByTestId('dead-letter-discard').click();
    await page.getByText('The job will not run again. Discard it?').waitFor();
    await page.getByRole('button', { name: 'Discard', exact: true }).last().click();
    await page.getByText('"test.label-printer" is discarded.').waitFor();
    await page.getByText('No failed jobs: every job finished or is still being tried.').waitFor();

    // Both are listed under Handled with who did what.
    await page.getByText('Handled', { exact: true }).click();
    await until(async () => (await items.count()) === 2);
    await expect(items.filter({ hasText: 'Closing abandoned checkouts' }).textContent()).resolves.toMatch(
      /Sent again.*by Joss/,
    );
    await expect(items.filter({ hasText: 'test.label-printer' }).textContent()).resolves.toMatch(/Discarded.*by Joss/);
    await page.screenshot({ path: `${SHOTS}/handled-1440.png`, fullPage: true });
    const audit = await ctx.db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.subject, `dead-letter:${expiry.id}`));
    expect(audit.map((event) => event.action)).toContain('job.retried');
    expect(e2e.problems(page)).toEqual([]);
  }, 180_000);
});
