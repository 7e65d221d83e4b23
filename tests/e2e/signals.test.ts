// Internal signals in a real browser against the real server: samples go in through the real
// intake with an ingest token, then the Services list, the signal explorer (rate with a counter
// reset, a too-short window refused at its field, a ratio with no traffic) and the CSV upload flow
// with its per-row report. Screenshots at phone and wide sizes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tokensService } from '../../server/services/tokens';
import type { Page } from 'playwright-core';
import { launchBrowser, screenshot, type TestBrowser } from '../helpers/browser';
import { startLiveServer, type LiveServer } from '../helpers/live-server';

let server: LiveServer;
let browser: TestBrowser;

const SERVICE = 'tea-shop';
const SIGNAL = 'http.server.requests';
const STEP_MS = 15_000;
const HOUR_MS = 3_600_000;
// Per 15 s: /menu grows by 30 (2 /s), /pay by 6 (0.4 /s), /idle not at all (no traffic).
const ROUTES = [
  { route: '/menu', perStep: 30 },
  { route: '/pay', perStep: 6 },
  { route: '/idle', perStep: 0 },
];

/**
 * A counter from an hour before the test began up to `now`, 15 s apart; /menu and /pay restart
 * (reset to 0) half an hour in. Each value depends only on its instant, so sending the points again
 * later stores only the new ones (the rest are duplicates).
 */
const START = Math.floor((Date.now() - HOUR_MS) / STEP_MS) * STEP_MS;
function counterPoints(now: number) {
  const points = [];
  const resetAt = START + HOUR_MS / 2;
  for (const { route, perStep } of ROUTES) {
    for (let t = START; t <= now - 1000; t += STEP_MS) {
      const steps = (t - START) / STEP_MS;
      const value = perStep === 0 ? 500 : t < resetAt ? 10_000 + perStep * steps : perStep * ((t - resetAt) / STEP_MS);
      points.push({ service: SERVICE, signal: SIGNAL, kind: 'counter', unit: '{request}', labels: { route }, t, value });
    }
  }
  return points;
}

function csvFile(size: string, now: number): { name: string; mimeType: string; buffer: Buffer } {
  const rows = ['time,route,orders'];
  for (let i = 0; i < 6; i++) rows.push(`${new Date(now - (6 - i) * 60_000).toISOString()},/pay,${100 + i * 5}`);
  // Two bad rows (rows 8 and 9 in spreadsheet numbering): a time that is not one, a value that is not a number.
  rows.push('yesterday-ish,/pay,140');
  rows.push(`${new Date(now - 30_000).toISOString()},/pay,lots`);
  return { name: `orders-${size}.csv`, mimeType: 'text/csv', buffer: Buffer.from(rows.join('\n') + '\n') };
}

beforeAll(async () => {
  server = await startLiveServer();
  browser = await launchBrowser();
}, 300_000);
afterAll(async () => {
  await browser?.close();
  await server?.close();
});

/** The counter goes in through the JSON batch intake with an ingest token; later calls send the newest points. */
let ingestToken: Promise<string> | null = null;
async function sendSamples(): Promise<void> {
  ingestToken ??= (async () => {
    const admin = await server.db.knex('users').where({ email: server.admin.email }).first();
    const created = await tokensService(server.db.knex).create(
      { type: 'user', id: admin.id, email: admin.email, name: admin.name, role: 'admin' },
      { name: 'tea-shop metrics', scopes: ['ingest'] },
    );
    return created.secret;
  })();
  const res = await fetch(`${server.url}/api/signals/samples`, {
    method: 'POST',
    headers: { authorization: `Bearer ${await ingestToken}`, 'content-type': 'application/json' },
    body: JSON.stringify({ points: counterPoints(Date.now()) }),
  });
  const body = (await res.json()) as { accepted: number; duplicates: number; rejected: number };
  expect(res.status).toBe(200);
  expect(body.rejected).toBe(0);
  expect(body.accepted + body.duplicates).toBeGreaterThan(700);
}

const SIZES = [
  { name: 'phone', width: 390, height: 844 },
  { name: 'wide', width: 1440, height: 900 },
] as const;

async function signIn(page: Page): Promise<void> {
  await page.goto(`${server.url}/`);
  await page.getByTestId('sign-in-email').waitFor({ timeout: 30_000 });
  await page.getByTestId('sign-in-email').fill(server.admin.email);
  await page.getByTestId('sign-in-password').fill(server.admin.password);
  await page.getByTestId('sign-in-submit').click();
  await page.getByTestId('nav-sign-out').waitFor({ timeout: 20_000 });
}

it('before any metrics, Services says how to send them', async () => {
  const { context, page } = await browser.newPage({ width: 390, height: 844 });
  try {
    await signIn(page);
    await page.getByTestId('nav-signals').click();
    await page.getByTestId('services-empty').waitFor({ timeout: 20_000 });
    await expect(page.getByTestId('services-empty').textContent()).resolves.toContain('/v1/metrics');
    await screenshot(page, 'signals-services-empty-phone');
  } finally {
    await context.close();
  }
}, 60_000);

describe.each(SIZES)('signals at $name size', (size) => {
  it('lists services, charts a rate, refuses a short window, says no traffic, imports a CSV', async () => {
    const { context, page } = await browser.newPage({ width: size.width, height: size.height });
    const byId = (id: string) => page.getByTestId(id);
    /** The latest-values table as group label → value text. */
    const latestByRoute = async () => {
      const out: Record<string, string> = {};
      for (let i = 0; i < (await page.locator('[data-testid^="signal-latest-row-"]').count()); i++) {
        out[(await byId(`signal-latest-label-${i}`).textContent())!.trim()] = (await byId(`signal-latest-value-${i}`).textContent())!.trim();
      }
      return out;
    };
    try {
      await sendSamples();
      await signIn(page);

      // Services: the service, its signal and when it last reported.
      await byId('nav-signals').click();
      await byId(`service-card-${SERVICE}`).waitFor({ timeout: 20_000 });
      await byId(`signal-row-${SERVICE}-${SIGNAL}`).waitFor({ timeout: 20_000 });
      await expect(byId(`service-last-sample-${SERVICE}`).textContent()).resolves.toMatch(/ago|just now/);
      await screenshot(page, `signals-services-${size.name}`);

      // Explorer: phones choose with selects, wide screens from the pane beside the chart. The newest
      // samples go in first, so the latest windows are full whatever time the steps above took.
      await sendSamples();
      if (size.name === 'phone') {
        await byId('signals-explore').click();
        await byId('explorer-service').selectOption(SERVICE);
        await byId('explorer-signal').selectOption(SIGNAL);
      } else {
        await byId(`signal-row-${SERVICE}-${SIGNAL}`).click();
        await byId('explorer-pane').waitFor({ timeout: 20_000 });
        await byId(`explorer-pane-signal-${SIGNAL}`).click();
      }
      await byId('explorer-fn-rate').click();
      await byId('signal-chart-canvas').waitFor({ timeout: 60_000 });
      await byId('signal-latest-value-2').waitFor({ timeout: 20_000 });

      // One line per route, latest rate of each: the reset half an hour ago does not show as a
      // negative or a spike, and the idle route reads 0 /s. /menu grows 30 and /pay 6 per 15 s at
      // the same instants, so their rates stand exactly 5 : 1 over any window; with a 5 min window
      // 20 deltas make 2 /s for /menu, fewer once the newest sample ages (the samples stopped).
      const rate = (text: string) => Number(/^([\d.]+) \/s$/.exec(text)?.[1]);
      let values = await latestByRoute();
      expect(Object.keys(values).sort()).toEqual(['route=/idle', 'route=/menu', 'route=/pay']);
      const menu = rate(values['route=/menu']!);
      expect(menu).toBeGreaterThan(1.4);
      expect(menu).toBeLessThanOrEqual(2);
      expect(rate(values['route=/pay']!)).toBeCloseTo(menu / 5, 5);
      expect(values['route=/idle']).toBe('0 /s');

      // Pointing at (wide) or tapping (phone) the chart reads the values at that time.
      const pointer = byId('signal-chart-pointer');
      await pointer.scrollIntoViewIfNeeded();
      const box = (await pointer.boundingBox())!;
      const at = { x: Math.round(box.width * 0.6), y: Math.round(box.height / 2) };
      if (size.name === 'phone') await pointer.click({ position: at });
      else await pointer.hover({ position: at });
      await expect.poll(() => byId('signal-readout-time').textContent(), { timeout: 5_000 }).toMatch(/\d{1,2}:\d{2}:\d{2}/);
      await byId('signal-readout-value-0').waitFor({ timeout: 5_000 });
      await screenshot(page, `signals-explorer-${size.name}`);

      // A window shorter than 2.5 sampling intervals is refused, and the field says the smallest.
      await byId('explorer-window').fill('20s');
      await page.getByText(/window must be at least 37\.5 s/).first().waitFor({ timeout: 20_000 });
      await byId('explorer-window').fill('5m');
      await page.getByText(/window must be at least/).first().waitFor({ state: 'detached', timeout: 20_000 });

      // A ratio per route: the idle route had no requests, which reads "no traffic", never 0 %.
      await byId('explorer-fn-ratio').click();
      await byId('explorer-by-route').click();
      await page.getByText('no traffic', { exact: true }).first().waitFor({ timeout: 20_000 });
      values = await latestByRoute();
      expect(values).toEqual({ 'route=/idle': 'no traffic', 'route=/menu': '100 %', 'route=/pay': '100 %' });
      await byId('explorer-chart').scrollIntoViewIfNeeded();
      await screenshot(page, `signals-ratio-${size.name}`);

      // CSV upload: read the columns, map them, import, and see the rows refused and why.
      await page.goto(`${server.url}/signals/upload`);
      await byId('csv-file').setInputFiles(csvFile(size.name, Date.now()));
      await byId('csv-read').click();
      await byId('csv-preview-table').waitFor({ timeout: 20_000 });
      await byId('csv-map-service').fill(SERVICE);
      await byId('csv-map-signal').fill(`orders.${size.name}`);
      await byId('csv-map-kind-counter').click();
      await byId('csv-import').click();
      await byId('csv-report').waitFor({ timeout: 30_000 });
      expect(await byId('csv-report-imported').textContent()).toBe('6');
      expect(await byId('csv-report-rejected').textContent()).toBe('2');
      await byId('csv-error-row-8').waitFor();
      await byId('csv-error-row-9').waitFor();
      await expect(byId('csv-error-row-9').textContent()).resolves.toContain('"lots" is not a number');
      await byId('csv-report').scrollIntoViewIfNeeded();
      await screenshot(page, `signals-csv-${size.name}`);

      // The same file again stores nothing twice.
      await byId('csv-import').click();
      await page.waitForFunction(() => document.querySelector('[data-testid="csv-report-duplicates"]')?.textContent === '6', null, { timeout: 30_000 });
      expect(await byId('csv-report-imported').textContent()).toBe('0');
      const stored = await server.db.knex('samples').join('series', 'series.id', 'samples.series_id').join('signals', 'signals.id', 'series.signal_id').where('signals.name', `orders.${size.name}`).count({ n: '*' }).first();
      expect(Number(stored!.n)).toBe(6);

      // Settings → Collection targets: add one, marking a key as a counter, then change it.
      await page.goto(`${server.url}/settings`);
      await byId('settings-link-collection-targets').click();
      await byId('target-form').waitFor({ timeout: 20_000 });
      const target = `stats-${size.name}`;
      await byId('target-name').fill(target);
      await byId('target-url').fill('http://127.0.0.1:9/stats.json');
      await byId('target-service').fill(SERVICE);
      await byId('target-interval').fill('30');
      await byId('target-counter-keys').fill('orders.total');
      await byId('target-save').click();
      await byId(`target-row-${target}`).waitFor({ timeout: 20_000 });
      const row = await server.db.knex('collection_targets').where({ name: target }).first();
      expect(row.interval_seconds).toBe(30);
      expect(row.counter_keys).toEqual(['orders.total']);
      await expect(byId(`target-status-${target}`).textContent()).resolves.toBe('Not run yet');
      await byId(`target-edit-${target}`).click();
      await byId('target-interval').fill('45');
      await byId('target-save').click();
      await page.getByText('every 45 s', { exact: false }).first().waitFor({ timeout: 20_000 });
      await byId(`target-row-${target}`).scrollIntoViewIfNeeded();
      await screenshot(page, `signals-targets-${size.name}`);

      expect(browser.foreign).toEqual([]);
    } catch (e) {
      await screenshot(page, `failure-signals-${size.name}`).catch(() => {});
      throw e;
    } finally {
      await context.close();
    }
  }, 180_000);
});
