/**
 * Sign-in in a real browser: every demo person signs in, sees their own home screen (name, roles' areas) and
 * signs out; a wrong password gets a clear message; a designer opening the admin screen sees Forbidden.
 * Screenshots go to /tmp/nestwright-e2e (not committed) for a person to look at.
 */
import { mkdirSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ROLES, type Role } from '../../shared/schemas/auth';
import { areasFor } from '../../src/router/areas';
import { demoPerson, pickMenuEntry, startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';

/** Lets fades and spinners finish so a screenshot shows the settled screen (not a check of anything). */
async function settle(page: Page): Promise<void> {
  await page.waitForTimeout(400);
}
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E();
}, 240_000);

afterAll(async () => {
  await e2e?.close();
});

// Browser steps on a shared 2-core machine: allow a minute per test (each step has its own 15 s limit).
describe('sign-in, home screen and sign-out', { timeout: 60_000 }, () => {
  it('shows the sign-in page to a signed-out visitor, keeping where they wanted to go', async () => {
    const page = await e2e.newPage();
    await page.goto('/admin/people');
    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/admin/people');
    // The staff screens load lazily after the address changes: wait for the heading, then check it is shown.
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await expect(page.getByRole('heading', { name: 'Sign in' }).isVisible()).resolves.toBe(true);
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/sign-in.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  // The areas each role should see come from the same registry the nav uses; the roles come from the seed.
  it.each(ROLES.map((role) => [role]))(
    'signs in as the demo %s, shows their home screen and signs out',
    async (role: Role) => {
      const person = demoPerson(role);
      const page = await e2e.newPage();
      await e2e.signIn(page, person.email, person.password);
      expect(new URL(page.url()).pathname).toBe('/');

      const heading = page.getByRole('heading', { level: 1 });
      await heading.waitFor();
      expect(await heading.textContent()).toContain(person.name.split(' ')[0]);
      expect(await page.getByTestId('person-name').textContent()).toBe(person.name);

      const expectedAreas = areasFor(person.roles);
      const cards = page.locator('.area-card');
      expect(await cards.count()).toBe(expectedAreas.length);
      for (const area of expectedAreas) {
        const card = page.locator(`.area-card[data-area="${area.id}"]`);
        expect(await card.textContent()).toContain(area.label);
        // Nav shows the same area, and only the areas this person's roles allow.
        await expect(
          page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: area.label }).isVisible(),
        ).resolves.toBe(true);
      }
      // Home plus the person's areas, nothing more.
      expect(await page.getByRole('navigation', { name: 'Areas' }).getByRole('link').count()).toBe(
        expectedAreas.length + 1,
      );
      if (expectedAreas.length === 0) expect(await page.getByTestId('no-areas').isVisible()).toBe(true);
      await settle(page);
      await page.screenshot({ path: `${SHOTS}/home-${role}.png` });

      await pickMenuEntry(page, page.getByRole('button', { name: `Account menu for ${person.name}` }), 'Sign out');
      await page
        .waitForURL((url) => url.pathname === '/sign-in')
        .catch((err: unknown) => {
          throw new Error(`after "Sign out" the page stayed at ${page.url()} (${String(err)})`);
        });

      // Signed out for real: the server no longer knows the session, and the app sends the visitor to sign in.
      const me = await page.request.get('/api/auth/me');
      expect(me.status()).toBe(401);
      await page.goto('/');
      await page.waitForURL((url) => url.pathname === '/sign-in');
      expect(e2e.problems(page)).toEqual([]);
      await page.context().close();
    },
  );

  it('says clearly that the e-mail or password is wrong, without moving the form', async () => {
    const person = demoPerson('designer');
    const page = await e2e.newPage();
    await page.goto('/sign-in');
    const button = page.getByRole('button', { name: 'Sign in' });
    const before = await button.boundingBox();
    await page.getByLabel('E-mail').fill(person.email);
    await page.getByLabel('Password', { exact: true }).fill('not-the-password');
    await page.keyboard.press('Enter'); // keyboard-friendly: Enter submits
    const alert = page.getByRole('alert').filter({ hasText: 'E-mail or password is wrong' });
    await alert.waitFor();
    const after = await button.boundingBox();
    // No layout shift: the message line is reserved before it appears (tolerance 0.5 px, common practice).
    expect(Math.abs((after?.y ?? 0) - (before?.y ?? 0))).toBeLessThan(0.5);
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/sign-in-wrong-password.png` });

    // Empty fields are caught in the browser, before any request.
    await page.getByLabel('E-mail').fill('');
    await page.getByLabel('Password', { exact: true }).fill('');
    await button.click();
    await page.getByText('Enter your e-mail address').waitFor();
    await page.getByText('Enter your password').waitFor();
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it('says how long to wait after too many attempts', async () => {
    // An e-mail of its own, so the limit (per address + e-mail) does not touch the other tests.
    const email = 'guesser@fernhollow.test';
    const page = await e2e.newPage();
    await page.goto('/sign-in');
    await page.getByLabel('E-mail').waitFor(); // the app is up before the guessing starts
    // Guess from inside the page (same client address as the form; the limit counts per address + e-mail).
    const lastStatus = await page.evaluate(async (guessEmail) => {
      let status = 0;
      for (let attempt = 0; attempt < 20 && status !== 429; attempt++) {
        const res = await fetch('/api/auth/sign-in', {
          method: 'POST',
          headers: { 'Content-Type': 'application/json' },
          body: JSON.stringify({ email: guessEmail, password: `guess-${attempt}` }),
        });
        status = res.status;
      }
      return status;
    }, email);
    expect(lastStatus).toBe(429);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill('one-more-guess');
    await page.getByRole('button', { name: 'Sign in' }).click();
    // The server's window is 15 minutes (server/auth/signInLimiter.ts); the page names the wait in minutes.
    await page
      .getByRole('alert')
      .filter({ hasText: /Too many attempts, try again in 1[45] minutes\./ })
      .waitFor();
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/sign-in-too-many.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it('shows Forbidden to a designer who opens the admin people screen', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'designer');
    await page.goto('/admin/people');
    await page.getByRole('heading', { name: 'This screen is not for your role' }).waitFor();
    expect(new URL(page.url()).pathname).toBe('/forbidden');
    // The server agrees: the people API refuses the designer.
    expect((await page.request.get('/api/people')).status()).toBe(403);
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/forbidden-designer.png` });
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it('asks for sign-in again when the session ends while a screen is open, then returns there', async () => {
    const page = await e2e.newPage();
    const admin = await e2e.signInAs(page, 'admin');
    // The session ends on the server behind the app's back (as when it expires or is ended in another tab).
    const status = await page.evaluate(async () => (await fetch('/api/auth/sign-out', { method: 'POST' })).status);
    expect(status).toBeLessThan(300);
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'People' }).click();
    await page.waitForURL((url) => url.pathname === '/sign-in');
    expect(new URL(page.url()).searchParams.get('next')).toBe('/admin/people');
    await page.getByLabel('E-mail').fill(admin.email);
    await page.getByLabel('Password', { exact: true }).fill(admin.password);
    await page.keyboard.press('Enter');
    await page.waitForURL((url) => url.pathname === '/admin/people');
    await page.getByRole('cell', { name: admin.email }).waitFor();
    expect(e2e.problems(page)).toEqual([]);
    await page.context().close();
  });

  it('lets the admin see the people table, add a person and change their roles', async () => {
    const page = await e2e.newPage();
    await e2e.signInAs(page, 'admin');
    await page.getByRole('navigation', { name: 'Areas' }).getByRole('link', { name: 'People' }).click();
    await page.waitForURL((url) => url.pathname === '/admin/people');
    for (const role of ROLES) await page.getByRole('cell', { name: demoPerson(role).email }).waitFor();
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/admin-people.png` });

    await page.getByRole('button', { name: 'Add a person' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.waitFor();
    // Client-side validation from the shared schema: a short password and no role are refused inline.
    await dialog.getByLabel('Name').fill('Wren Ashdown');
    await dialog.getByLabel('E-mail').fill('wren@fernhollow.test');
    await dialog.getByLabel('Initial password').fill('short');
    await dialog.getByRole('button', { name: 'Add person' }).click();
    await dialog.getByText('The password needs at least 10 characters.').waitFor();
    await dialog.getByText('Choose at least one role.').waitFor();
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/admin-add-invalid.png` });

    await dialog.getByLabel('Initial password').fill('wren-password-1');
    await dialog.getByRole('checkbox', { name: 'Designer' }).click();
    await dialog.getByRole('button', { name: 'Add person' }).click();
    await page.getByRole('cell', { name: 'wren@fernhollow.test' }).waitFor();

    await page.getByRole('button', { name: 'Edit Wren Ashdown' }).click();
    await page.getByRole('dialog').getByRole('checkbox', { name: 'Sales' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('dialog').waitFor({ state: 'detached' });
    const row = page.getByRole('row').filter({ hasText: 'wren@fernhollow.test' });
    expect(await row.textContent()).toContain('Sales');

    // Server-side refusals are shown at the field they concern.
    await page.getByRole('button', { name: 'Add a person' }).click();
    await page.getByRole('dialog').getByLabel('Name').fill('Second Wren');
    await page.getByRole('dialog').getByLabel('E-mail').fill('wren@fernhollow.test');
    await page.getByRole('dialog').getByLabel('Initial password').fill('wren-password-2');
    await page.getByRole('dialog').getByRole('checkbox', { name: 'Sales' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Add person' }).click();
    await page.getByRole('dialog').getByText('A person with this e-mail already exists.').waitFor();
    await page.getByRole('dialog').getByRole('button', { name: 'Cancel' }).click();
    await page.getByRole('dialog').waitFor({ state: 'detached' });

    const admin = demoPerson('admin');
    await page.getByRole('button', { name: `Edit ${admin.name}` }).click();
    await page.getByRole('dialog').getByRole('checkbox', { name: 'Designer' }).click();
    await page.getByRole('dialog').getByRole('checkbox', { name: 'Admin' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Save', exact: true }).click();
    await page.getByRole('dialog').getByText('The studio needs at least one admin').waitFor();
    await settle(page);
    await page.screenshot({ path: `${SHOTS}/admin-last-admin.png` });
    await page.getByRole('dialog').getByRole('button', { name: 'Cancel' }).click();

    // The new person can sign in with the initial password and sees both roles' home.
    const wren = await e2e.newPage();
    await e2e.signIn(wren, 'wren@fernhollow.test', 'wren-password-1');
    expect(await wren.getByTestId('person-name').textContent()).toBe('Wren Ashdown');
    expect(e2e.problems(page)).toEqual([]);
    expect(e2e.problems(wren)).toEqual([]);
    await wren.context().close();
    await page.context().close();
  });
});
