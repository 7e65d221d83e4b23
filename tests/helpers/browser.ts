// A real browser for tests: Debian's chromium driven by playwright-core (never a downloaded one),
// with every request to a non-loopback address recorded, and no name but loopback resolvable.
import fs from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM = process.env.PARALLAX_CHROMIUM ?? '/usr/bin/chromium';
export const SCREENS_DIR = path.resolve(__dirname, '../.artifacts/screens');

export interface TestBrowser {
  browser: Browser;
  /** URLs the page tried to reach outside loopback (none can resolve). */
  foreign: string[];
  newPage(viewport: { width: number; height: number }): Promise<{ context: BrowserContext; page: Page }>;
  close(): Promise<void>;
}

export async function launchBrowser(): Promise<TestBrowser> {
  if (!fs.existsSync(CHROMIUM)) throw new Error(`${CHROMIUM} is missing: apt-get install chromium (the .ci/run script does)`);
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-dev-shm-usage',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      // Every name but loopback fails to resolve, so nothing can leave the machine.
      '--host-resolver-rules=MAP * ~NOTFOUND, EXCLUDE localhost, EXCLUDE 127.0.0.1',
    ],
  });
  const foreign: string[] = [];
  return {
    browser,
    foreign,
    async newPage(viewport) {
      const context = await browser.newContext({ viewport });
      // Watch rather than intercept: intercepting requests changes how Chromium handles their
      // cookies. Any request to a non-loopback address is recorded (and cannot resolve).
      context.on('request', (req) => {
        const u = new URL(req.url());
        const local = ['127.0.0.1', 'localhost', '[::1]'].includes(u.hostname) || ['data:', 'blob:'].includes(u.protocol);
        if (!local) foreign.push(u.href);
      });
      return { context, page: await context.newPage() };
    },
    async close() {
      // playwright gives each launch a fresh profile directory of its own and removes it here.
      await browser.close();
    },
  };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(SCREENS_DIR, { recursive: true });
  const file = path.join(SCREENS_DIR, `${name}.png`);
  await page.screenshot({ path: file, fullPage: false });
  return file;
}
