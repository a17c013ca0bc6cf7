import type { Page } from 'playwright-core';
import type { TestAccount } from '../../support/accounts.js';

/** Signs in on the app's own form, as a person would. */
export async function signIn(page: Page, origin: string, account: TestAccount): Promise<void> {
  await page.goto(`${origin}/sign-in`);
  await page.getByLabel('E-mail').fill(account.email);
  await page.getByLabel('Password', { exact: true }).fill(account.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
}

/** Syncs now from "This device" and waits until everything changed here has reached the server. */
export async function untilSynced(page: Page, origin: string): Promise<void> {
  await page.goto(`${origin}/device`);
  const syncNow = page.getByRole('button', { name: 'Sync now' });
  await syncNow.waitFor();
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar'));
  await syncNow.click();
  await page.getByText('Everything changed on this device has reached the server.').waitFor({ timeout: 30_000 });
  await page.waitForFunction(() => !document.querySelector('mat-progress-bar'), null, { timeout: 30_000 });
}
