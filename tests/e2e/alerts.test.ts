// Alerting in a real browser against the real server: an hour of a gauge goes in through the real
// intake with an ingest token (it crosses the threshold half-way through), then an admin builds a
// threshold rule in the editor, sees a too-short window refused at its field (naming the minimum)
// and an empty responder note refused, replays the rule over the last 7 days (it would have raised),
// saves it and finds it in the rules list. One evaluation pass over the hour then gives the Alerts
// screen a raised alert with its responder note. Screenshots at phone and wide sizes.
import type PgBoss from 'pg-boss';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { tokensService } from '../../server/services/tokens';
import { startBoss } from '../../worker/boss';
import { runEvaluationCycle } from '../../worker/evaluator/cycle';
import { launchBrowser, screenshot, type TestBrowser } from '../helpers/browser';
import { startLiveServer, type LiveServer } from '../helpers/live-server';

let server: LiveServer;
let browser: TestBrowser;
let boss: PgBoss | undefined;

const SERVICE = 'tea-shop';
const SIGNAL = 'queue.depth';
const STEP_MS = 15_000;
const HOUR_MS = 3_600_000;
const THRESHOLD = 50;
const NOTE = 'Check the order workers: restart a stuck one, then watch the queue drain.';
let dataStart = 0;
let dataEnd = 0;

/** A gauge over the last hour, 15 s apart: about 20 for the first half, about 80 from the middle on. */
function gaugePoints(now: number) {
  const points = [];
  dataStart = Math.floor((now - HOUR_MS) / STEP_MS) * STEP_MS;
  for (let t = dataStart, i = 0; t <= now - 1000; t += STEP_MS, i++) {
    const base = t < dataStart + HOUR_MS / 2 ? 20 : 80;
    dataEnd = t;
    points.push({ service: SERVICE, signal: SIGNAL, kind: 'gauge', unit: '{job}', labels: { queue: 'orders' }, t, value: base + 3 * Math.sin(i / 5) });
  }
  return points;
}

beforeAll(async () => {
  server = await startLiveServer();
  browser = await launchBrowser();
  const created = await tokensService(server.db.knex).create({ type: 'token', id: 0, name: 't', scopes: [] }, { name: 'ingest', scopes: ['ingest'] });
  const res = await fetch(`${server.url}/api/signals/samples`, {
    method: 'POST',
    headers: { authorization: `Bearer ${created.secret}`, 'content-type': 'application/json' },
    body: JSON.stringify({ points: gaugePoints(Date.now()) }),
  });
  const body = (await res.json()) as { accepted: number; rejected: number };
  expect(res.status).toBe(200);
  expect(body.rejected).toBe(0);
  expect(body.accepted).toBeGreaterThanOrEqual(239);
}, 300_000);

afterAll(async () => {
  await boss?.stop({ graceful: false, wait: true });
  await browser?.close();
  await server?.close();
});

/**
 * The evaluator's cycles over the hour, once, as a worker would have run them while the samples
 * arrived (up to the last one: later cycles would rightly see no data): the rule raises.
 */
let evaluated: Promise<void> | null = null;
function evaluateHour(): Promise<void> {
  evaluated ??= (async () => {
    boss = await startBoss(server.db.settings);
    for (let at = dataStart + HOUR_MS / 4; at <= dataEnd; at += STEP_MS) {
      const summary = await runEvaluationCycle(server.db.knex, boss, at, { staleAfterMs: HOUR_MS, log: () => {} });
      expect(summary.errors).toEqual([]);
    }
  })();
  return evaluated;
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

describe.each(SIZES)('alerts at $name size', (size) => {
  it('builds a threshold rule, replays it, saves it, then shows the raised alert', async () => {
    const { context, page } = await browser.newPage({ width: size.width, height: size.height });
    const byId = (id: string) => page.getByTestId(id);
    const ruleName = `Order queue too deep (${size.name})`;
    try {
      await signIn(page);
      await byId('nav-alerts').click();
      await byId('alerts-screen').waitFor({ timeout: 20_000 });
      await byId('alerts-rules').click();
      await byId('rules-screen').waitFor({ timeout: 20_000 });
      await byId('rules-new').click();
      await byId('rule-editor-screen').waitFor({ timeout: 20_000 });

      await byId('rule-kind').selectOption('threshold');
      await byId('rule-name').fill(ruleName);
      await byId('rule-service').locator(`option[value="${SERVICE}"]`).waitFor({ state: 'attached', timeout: 20_000 });
      await byId('rule-service').selectOption(SERVICE);
      await byId('rule-signal').locator(`option[value="${SIGNAL}"]`).waitFor({ state: 'attached', timeout: 20_000 });
      await byId('rule-signal').selectOption(SIGNAL);
      await byId('rule-op').selectOption('>');
      await byId('rule-threshold').fill(String(THRESHOLD));
      await byId('rule-sustain').fill('1m');
      await byId('rule-clear').fill('1m');

      // No responder note: refused at its field, nothing saved.
      await byId('rule-window').fill('1m');
      await byId('rule-save').click();
      await page.getByText('Write the responder note', { exact: false }).first().waitFor({ timeout: 10_000 });
      await expect(byId('rule-editor-screen').isVisible()).resolves.toBe(true);
      await byId('rule-responder-note').fill(NOTE);

      // A window shorter than 2.5 × the 15 s sampling interval: the server names the minimum at the field.
      await byId('rule-window').fill('10s');
      await byId('rule-replay').click();
      await page.getByText('window must be at least 37.5 s', { exact: false }).first().waitFor({ timeout: 20_000 });

      // Replay the last 7 days: the crossing half an hour ago would have raised.
      await byId('rule-window').fill('1m');
      await byId('rule-replay').click();
      await byId('rule-replay-count').waitFor({ timeout: 30_000 });
      const count = Number(/Would have raised (\d+) time/.exec((await byId('rule-replay-count').textContent()) ?? '')?.[1]);
      expect(count).toBeGreaterThanOrEqual(1);
      // The raised span is drawn in the strip under the chart (loaded lazily with CanvasKit).
      await byId('rule-replay-chart-strip-span-raised').first().waitFor({ state: 'attached', timeout: 30_000 });
      await byId('signal-chart-canvas').waitFor({ timeout: 120_000 });
      await byId('rule-replay-chart').scrollIntoViewIfNeeded();
      await page.waitForTimeout(1500);
      await screenshot(page, `alerts-rule-editor-${size.name}`);

      await byId('rule-save').click();
      await byId('rules-screen').waitFor({ timeout: 20_000 });
      await page.getByText(ruleName).first().waitFor({ timeout: 20_000 });
      await screenshot(page, `alerts-rules-${size.name}`);

      // The evaluator's pass over the hour raises the rule; Alerts shows it with its note first.
      await evaluateHour();
      await byId('rules-back').click();
      await byId('alerts-screen').waitFor({ timeout: 20_000 });
      await page.reload();
      await byId('alerts-now').getByText(NOTE).first().waitFor({ timeout: 20_000 });
      await expect(byId('alerts-now').getByText('Raised').count()).resolves.toBeGreaterThanOrEqual(1);
      if (size.name === 'wide') {
        await byId('alerts-detail-pane').getByTestId('alert-detail-note').waitFor({ timeout: 20_000 });
        await byId('alerts-detail-pane').getByTestId('signal-chart-canvas').waitFor({ timeout: 60_000 });
        await page.waitForTimeout(800);
      }
      await screenshot(page, `alerts-${size.name}`);
      if (size.name === 'phone') {
        await page.locator('[data-testid^="alert-row-"]').first().click();
        await byId('alert-detail-screen').waitFor({ timeout: 20_000 });
        await byId('signal-chart-canvas').waitFor({ timeout: 60_000 });
        await byId('alert-timeline').scrollIntoViewIfNeeded();
        await page.waitForTimeout(1500);
        await screenshot(page, `alerts-detail-${size.name}`);
      }
      expect(browser.foreign).toEqual([]);
    } finally {
      await context.close();
    }
  }, 240_000);
});
