// The web app in a real browser against the real server: sign in as the first admin, add a person
// through the form, see them in the table, sign out. Screenshots at phone and wide sizes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { launchBrowser, screenshot, type TestBrowser } from '../helpers/browser';
import { startLiveServer, type LiveServer } from '../helpers/live-server';

let server: LiveServer;
let browser: TestBrowser;

beforeAll(async () => {
  server = await startLiveServer();
  browser = await launchBrowser();
}, 300_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

const SIZES = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'wide', width: 1440, height: 900 },
] as const;

describe.each(SIZES)('web app at $name size', (size) => {
  it('signs in, adds a person, shows them, signs out', async () => {
    const { context, page } = await browser.newPage({ width: size.width, height: size.height });
    try {
      const byId = (id: string) => page.getByTestId(id);
      await page.goto(`${server.url}/`);
      // Signed out: the protected app sends us to sign in.
      await byId('sign-in-email').waitFor({ timeout: 30_000 });
      await screenshot(page, `sign-in-${size.name}`);

      // The form validates with the shared schema before anything is sent.
      await byId('sign-in-email').fill('not-an-email');
      await byId('sign-in-password').fill('x');
      await byId('sign-in-submit').click();
      await expect(page.getByText(/valid email/i).first().isVisible()).resolves.toBe(true);

      await byId('sign-in-email').fill(server.admin.email);
      await byId('sign-in-password').fill(server.admin.password);
      await byId('sign-in-submit').click();
      await byId('nav-sign-out').waitFor({ timeout: 20_000 });
      await page.getByText(/Signed in as First admin/).first().waitFor({ timeout: 20_000 });
      await screenshot(page, `now-${size.name}`);

      await page.goto(`${server.url}/settings/people`);
      await byId('people-add-email').waitFor({ timeout: 20_000 });
      const email = `ines.thorne.${size.name}@example.test`;
      await byId('people-add-email').fill(email);
      await byId('people-add-name').fill(`Ines Thorne (${size.name})`);
      await byId('people-add-password').fill('a long enough password');
      await byId('people-add-role').selectOption('reviewer');
      await byId('people-add-submit').click();
      await byId(`people-row-${email}`).waitFor({ timeout: 20_000 });
      const row = await server.db.knex('users').where({ email }).first();
      expect(row).toBeDefined();
      await screenshot(page, `people-${size.name}`);

      await page.goto(`${server.url}/settings/tokens`);
      await byId('token-name').waitFor({ timeout: 20_000 });
      await screenshot(page, `tokens-${size.name}`);

      await page.goto(`${server.url}/journeys`);
      await page.waitForTimeout(500);
      await screenshot(page, `journeys-${size.name}`);

      await byId('nav-sign-out').click();
      await byId('sign-in-email').waitFor({ timeout: 20_000 });
      const me = await page.evaluate(async () => (await fetch('/api/auth/me')).status);
      expect(me).toBe(401);
      expect(browser.foreign).toEqual([]);
    } catch (e) {
      await screenshot(page, `failure-${size.name}`).catch(() => {});
      throw e;
    } finally {
      await context.close();
    }
  }, 120_000);
});
