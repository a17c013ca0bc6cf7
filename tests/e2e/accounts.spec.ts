import type { Browser, Page } from 'playwright-core';
import { linkIn, MailSink } from '../../server/mail/mail-sink.js';
import { startAppServer, type RunningApp } from './support/app-server.js';
import { launchChromium, PHONE, screenshotPath } from './support/browser.js';

const PASSWORD = 'lichen on the pier';

describe('accounts through the real e-mail, in the browser', () => {
  let app: RunningApp;
  let browser: Browser;
  let mail: MailSink;

  beforeAll(async () => {
    mail = new MailSink();
    await mail.listen(0);
    app = await startAppServer({ SMTP_URL: `smtp://127.0.0.1:${mail.port}` });
    browser = await launchChromium();
  }, 60_000);

  afterAll(async () => {
    await browser?.close();
    await app?.stop();
    await mail?.close();
  });

  async function phonePage(): Promise<Page> {
    return (await browser.newContext(PHONE)).newPage();
  }

  async function signIn(page: Page, email: string, password: string): Promise<void> {
    await page.goto(`${app.origin}/sign-in`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(password);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
  }

  /** Fills the sign-up form, opening it first unless the page is on it already. */
  async function signUp(page: Page, url: string | null, name: string, email: string): Promise<void> {
    if (url) await page.goto(url);
    await page.getByLabel('Your name').fill(name);
    if (email) await page.getByLabel('E-mail').fill(email);
    // From an invitation the address comes from the invitation itself.
    else await page.getByText('The invitation was sent to this address').waitFor();
    await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();
  }

  function unique(who: string): string {
    return `${who}-${Date.now().toString(36)}@benchtide.test`;
  }

  it('should sign up, confirm by the e-mailed link, and sign in', async () => {
    const page = await phonePage();
    const email = unique('rowan');

    await signUp(page, `${app.origin}/sign-up`, 'Rowan', email);
    await page.getByRole('heading', { name: 'Check your e-mail' }).waitFor();
    await page.goto(linkIn(await mail.waitFor(email, (m) => m.subject.includes('Confirm'))));
    await page
      .getByText(/confirmed/i)
      .first()
      .waitFor();
    await signIn(page, email, PASSWORD);
    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await page.goto(`${app.origin}/workshop`);

    await page.getByText("Rowan's bench").first().waitFor();
    await page.screenshot({ path: screenshotPath('workshop-phone'), fullPage: true });
  }, 60_000);

  it('should reset a forgotten password by the e-mailed link', async () => {
    const page = await phonePage();
    const email = unique('sable');
    await signUp(page, `${app.origin}/sign-up`, 'Sable', email);
    await page.goto(linkIn(await mail.waitFor(email, (m) => m.subject.includes('Confirm'))));
    await page
      .getByText(/confirmed/i)
      .first()
      .waitFor();

    await page.goto(`${app.origin}/forgot-password`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.goto(linkIn(await mail.waitFor(email, (m) => m.subject.includes('new Benchtide password'))));
    await page.getByLabel('New password', { exact: true }).fill('harbour wall at noon');
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByRole('link', { name: 'Sign in' }).first().waitFor();
    await signIn(page, email, 'harbour wall at noon');

    await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  }, 60_000);

  it('should invite someone new, who signs up from the link and joins the workshop', async () => {
    const owner = await phonePage();
    const ownerEmail = unique('tamsin');
    await signUp(owner, `${app.origin}/sign-up`, 'Tamsin', ownerEmail);
    await owner.goto(linkIn(await mail.waitFor(ownerEmail, (m) => m.subject.includes('Confirm'))));
    await owner
      .getByText(/confirmed/i)
      .first()
      .waitFor();
    await signIn(owner, ownerEmail, PASSWORD);
    await owner.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await owner.goto(`${app.origin}/workshop`);
    const guestEmail = unique('ulric');
    await owner.getByLabel('Their e-mail').fill(guestEmail);
    await owner.getByRole('button', { name: 'Send invitation' }).click();

    const guest = await phonePage();
    await guest.goto(linkIn(await mail.waitFor(guestEmail, (m) => m.subject.includes('invites you'))));
    await guest
      .getByRole('link', { name: /sign up|create/i })
      .first()
      .click();
    await signUp(guest, null, 'Ulric', '');
    await guest.getByRole('heading', { name: 'Nearly there' }).waitFor();
    await signIn(guest, guestEmail, PASSWORD);
    await guest.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
    await guest.goto(`${app.origin}/workshop`);

    await guest.getByText("Tamsin's bench").first().waitFor();
  }, 90_000);
});
