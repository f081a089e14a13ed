/**
 * Account actions in a real browser: the admin resets a person's password (shown once), that person signs in with
 * it and changes it on the change-password screen, then the admin deactivates them and the sign-in page says so.
 * The rules are our own product decisions (no outside source). Screenshots go to /tmp/nestwright-e2e.
 */
import { mkdirSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoPerson, pickMenuEntry, startE2E, type E2E } from './harness';

const SHOTS = '/tmp/nestwright-e2e';
let e2e: E2E;

beforeAll(async () => {
  mkdirSync(SHOTS, { recursive: true });
  e2e = await startE2E();
}, 240_000);
afterAll(async () => {
  await e2e?.close();
});

/** Opens the "More" menu of one person's row and picks an action. */
async function rowAction(page: Page, name: string, action: string): Promise<void> {
  await pickMenuEntry(page, page.getByRole('button', { name: `More actions for ${name}` }), action);
}

describe('admin account actions and change password', { timeout: 120_000 }, () => {
  it('reset, sign in with the new password, change it, then deactivate', async () => {
    const sales = demoPerson('sales');
    const admin = await e2e.newPage();
    await e2e.signInAs(admin, 'admin');
    await admin.goto('/admin/people');

    await rowAction(admin, sales.name, 'Reset password…');
    await admin.getByRole('button', { name: 'Reset password' }).click();
    const shown = admin.getByTestId('new-password');
    await shown.waitFor();
    const generated = (await shown.textContent())?.trim() ?? '';
    expect(generated).toMatch(/^[a-z2-9]{4}(-[a-z2-9]{4}){3}$/);
    await admin.screenshot({ path: `${SHOTS}/people-password-once.png` });
    await admin.getByRole('button', { name: 'Done' }).click();
    // Shown once: gone when the dialog has closed (it fades out, so wait for it to leave the page).
    await shown.waitFor({ state: 'detached' });
    await expect(shown.count()).resolves.toBe(0);

    const person = await e2e.newPage();
    await e2e.signIn(person, sales.email, generated);
    await pickMenuEntry(
      person,
      person.getByRole('button', { name: `Account menu for ${sales.name}` }),
      'Change password',
    );
    await person.waitForURL((url) => url.pathname === '/account/password');
    await person.getByLabel('Current password').fill('not-the-password');
    await person.getByLabel('New password', { exact: true }).fill('short');
    await person.getByLabel('New password again').fill('short');
    await person.getByRole('button', { name: 'Change password' }).click();
    await person.getByText('The password needs at least 10 characters.').waitFor();

    await person.getByLabel('New password', { exact: true }).fill('a-garden-path-with-wrens');
    await person.getByLabel('New password again').fill('a-garden-path-with-wrens');
    await person.getByRole('button', { name: 'Change password' }).click();
    await person.getByText('The current password is not right.').waitFor();

    await person.getByLabel('Current password').fill(generated);
    await person.getByRole('button', { name: 'Change password' }).click();
    await person.getByTestId('password-changed').waitFor();
    await person.screenshot({ path: `${SHOTS}/change-password.png` });
    expect(e2e.problems(person).filter((p) => !p.includes('400'))).toEqual([]);

    await rowAction(admin, sales.name, 'Deactivate…');
    await admin.getByRole('button', { name: 'Deactivate', exact: true }).click();
    await admin.getByTestId('deactivated').waitFor();

    const again = await e2e.newPage();
    await again.goto('/sign-in');
    await again.getByLabel('E-mail').fill(sales.email);
    await again.getByLabel('Password').fill('a-garden-path-with-wrens');
    await again.getByRole('button', { name: 'Sign in' }).click();
    await again.getByText('This account has been deactivated.', { exact: false }).waitFor();

    await rowAction(admin, sales.name, 'Reactivate');
    await expect(admin.getByTestId('deactivated').count()).resolves.toBe(0);
    expect(e2e.problems(admin)).toEqual([]);
  });
});
