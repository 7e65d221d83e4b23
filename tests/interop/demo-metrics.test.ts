// The demo shop reports its own metrics with the OpenTelemetry SDK to the real server's
// /v1/metrics, so `npm start` shows live internal signals.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoIngestToken, seedDemoRules } from '../../scripts/seed-demo';
import { DEMO_SERVICE, startDemoMetrics, type DemoMetrics } from '../../scripts/demo-metrics';
import { startDemoTarget, type DemoTarget } from '../../scripts/demo-target';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { addPerson, buildTestApp, signIn, type TestApp } from '../helpers/app';

let t: TestApp;
let server: http.Server;
let shop: DemoTarget;
let metrics: DemoMetrics;

beforeAll(async () => {
  t = await buildTestApp();
  server = http.createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'px-demo-'));
  const token = await demoIngestToken(t.db.knex, dir);
  expect(await demoIngestToken(t.db.knex, dir)).toBe(token); // kept, not re-made
  metrics = startDemoMetrics({ endpoint: `http://127.0.0.1:${(server.address() as AddressInfo).port}/v1/metrics`, token, intervalMs: 60_000 });
  shop = await startDemoTarget({ port: 0, onRequest: metrics.onRequest, random: () => 0 });
});
afterAll(async () => {
  await shop.close();
  await metrics.close();
  server.close();
  await t.close();
});

describe('demo shop metrics', () => {
  it('arrive as a request counter, an error counter and a latency histogram of the shop service', async () => {
    for (let i = 0; i < 6; i++) await (await fetch(`${shop.url}/api/search?q=oolong`)).text();
    await shop.control({ errorRate: 1 });
    for (let i = 0; i < 4; i++) await (await fetch(`${shop.url}/api/search?q=oolong`)).text();
    await metrics.flush();

    const viewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
    const signals = await viewer.agent.get(`/api/signals?service=${DEMO_SERVICE}`).expect(200);
    const byName = Object.fromEntries(signals.body.items.map((s: { name: string; kind: string }) => [s.name, s.kind]));
    expect(byName).toMatchObject({ 'http.server.requests': 'counter', 'http.server.errors': 'counter', 'http.server.duration': 'histogram' });

    const rows = await t.db.knex.raw(
      `SELECT sig.name, s.labels, max(x.value) AS v FROM samples x JOIN series s ON s.id = x.series_id JOIN signals sig ON sig.id = s.signal_id
        WHERE sig.name IN ('http.server.requests', 'http.server.errors') GROUP BY sig.name, s.labels`,
    );
    const total = (name: string, f: (l: Record<string, string>) => boolean = () => true) =>
      rows.rows.filter((r: { name: string; labels: Record<string, string> }) => r.name === name && f(r.labels)).reduce((a: number, r: { v: number }) => a + Number(r.v), 0);
    expect(total('http.server.requests')).toBe(10);
    expect(total('http.server.requests', (l) => l.status_class === '5xx')).toBe(4);
    expect(total('http.server.errors')).toBe(4);

    // With the shop's signals present, the demo's alert rules can be made, once.
    expect(await seedDemoRules(t.db.knex)).toBe(true);
    expect(await seedDemoRules(t.db.knex)).toBe(true);
    const rules = await viewer.agent.get('/api/rules').expect(200);
    const names = (rules.body.items as { name: string }[]).map((r) => r.name).sort();
    expect(names).toEqual(['Shop errors above 10 %', 'Shop p95 latency above 500 ms']);
  });

  it('has no demo rules to make before the signals exist', async () => {
    await t.db.knex('settings').where({ key: 'demo_rules_seeded' }).delete();
    await t.db.knex('signals').where({ name: 'http.server.duration' }).update({ name: 'renamed.for.test' });
    expect(await seedDemoRules(t.db.knex)).toBe(false);
  });
});
