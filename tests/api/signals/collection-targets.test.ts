// Collection targets: the CRUD API (engineers write, everyone reads), and the worker's collection
// from a real local JSON endpoint, directly and through pg-boss.
import http from 'node:http';
import PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { collectTarget, documentToPoints } from '../../../worker/collector/collect-target';
import { startCollector } from '../../../worker/collector/collector';
import { counterMatcher, flattenNumbers } from '../../../worker/collector/flatten';
import { collectionTargetsRepo } from '../../../server/signals/repositories/collection-targets-repo';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';

let t: TestApp;
let engineer: SignedIn;
let reviewer: SignedIn;
let server: http.Server;
let url: string;
let doc: unknown = {};

beforeAll(async () => {
  t = await buildTestApp();
  // Collection obeys the target rules; the endpoints here live on loopback, which they must allow.
  await t.db.knex('settings').insert({ key: 'target_policy', value: JSON.stringify({ allowLoopback: true }) });
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  reviewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
  server = http.createServer((req, res) => {
    if (req.url === '/broken') {
      res.writeHead(500).end('no');
      return;
    }
    res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(doc));
  });
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  url = `http://127.0.0.1:${(server.address() as { port: number }).port}/stats`;
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
  await t.close();
});

const create = (who: SignedIn, body: Record<string, unknown>) => who.agent.post('/api/signals/collection-targets').set('x-csrf-token', who.csrf).send(body);

describe('flattening', () => {
  it('joins nested keys with dots, indexes lists, keeps only finite numbers', () => {
    expect(flattenNumbers({ a: { b: 1, c: [2, { d: 3 }] }, s: 'up', ok: true, n: null, e: 1e400 })).toEqual([
      ['a.b', 1],
      ['a.c.0', 2],
      ['a.c.1.d', 3],
    ]);
    const isCounter = counterMatcher(['http.requests', 'db.*.queries']);
    expect(['http.requests', 'db.main.queries', 'db.main.x.queries', 'http.requests.x'].map(isCounter)).toEqual([true, true, false, false]);
    const pts = documentToPoints({ service: 's', counterKeys: ['hits'], labels: { env: 'prod' }, prefix: 'app.' }, { hits: 5, load: 0.5 }, 1000);
    expect(pts.map((p) => [p.signal, p.kind, p.labels, p.t])).toEqual([
      ['app.hits', 'counter', { env: 'prod' }, 1000],
      ['app.load', 'gauge', { env: 'prod' }, 1000],
    ]);
  });
});

describe('collection targets API', () => {
  it('lets engineers create, change and delete targets, recording each change', async () => {
    const res = await create(engineer, { name: 'stats', service: 'legacy-app', url, intervalSeconds: 30, counterKeys: ['requests.total'] });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ name: 'stats', service: 'legacy-app', url, intervalSeconds: 30, counterKeys: ['requests.total'], enabled: true, lastRunAt: null });
    expect((await create(engineer, { name: 'stats', service: 'x', url, intervalSeconds: 30 })).status).toBe(409);
    const bad = await create(engineer, { name: 'b', service: 'x', url: 'ftp://example.test/', intervalSeconds: 1 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('url');
    expect((await create(engineer, { name: 'b', service: 'x', url, intervalSeconds: 1 })).body.error.field).toBe('intervalSeconds');

    const id = res.body.id;
    const patched = await engineer.agent.patch(`/api/signals/collection-targets/${id}`).set('x-csrf-token', engineer.csrf).send({ enabled: false, intervalSeconds: 60 });
    expect(patched.body).toMatchObject({ enabled: false, intervalSeconds: 60, counterKeys: ['requests.total'] });
    const list = await reviewer.agent.get('/api/signals/collection-targets').expect(200);
    expect(list.body.items.map((x: { name: string }) => x.name)).toEqual(['stats']);
    expect((await create(reviewer, { name: 'r', service: 'x', url, intervalSeconds: 30 })).status).toBe(403);
    expect((await engineer.agent.delete(`/api/signals/collection-targets/${id}`).set('x-csrf-token', engineer.csrf)).status).toBe(204);
    expect((await engineer.agent.delete(`/api/signals/collection-targets/${id}`).set('x-csrf-token', engineer.csrf)).status).toBe(404);
    const actions = await t.db.knex('audit_events').where('action', 'like', 'collection_target.%').orderBy('id').pluck('action');
    expect(actions).toEqual(['collection_target.create', 'collection_target.update', 'collection_target.delete']);
  });
});

describe('collector', () => {
  it('stores counters and gauges from the endpoint at the claimed slot; a retried slot stores nothing new', async () => {
    const res = await create(engineer, { name: 'direct', service: 'legacy', url, intervalSeconds: 30, counterKeys: ['requests.total'], labels: { instance: 'a' } });
    const target = (await collectionTargetsRepo.byId(t.db.knex, res.body.id))!;
    doc = { requests: { total: 120, active: 3 }, uptime: 99.5, status: 'ok' };
    const slot = Date.UTC(2026, 0, 20, 8, 0, 0);
    expect(await collectTarget(t.db.knex, target, slot)).toEqual({ samples: 3, error: null });
    expect(await collectTarget(t.db.knex, target, slot)).toEqual({ samples: 3, error: null });
    const rows = await t.db.knex.raw(
      `SELECT g.name, g.kind, x.labels, s.value FROM samples s JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id
       JOIN services v ON v.id = g.service_id WHERE v.name = 'legacy' ORDER BY g.name`,
    );
    expect(rows.rows).toEqual([
      { name: 'requests.active', kind: 'gauge', labels: { instance: 'a' }, value: 3 },
      { name: 'requests.total', kind: 'counter', labels: { instance: 'a' }, value: 120 },
      { name: 'uptime', kind: 'gauge', labels: { instance: 'a' }, value: 99.5 },
    ]);
    const after = (await collectionTargetsRepo.byId(t.db.knex, target.id))!;
    expect(after).toMatchObject({ lastError: null, lastSampleCount: 3 });
    expect(after.lastRunAt).not.toBeNull();
  });

  it('records a failing endpoint and refuses link-local addresses', async () => {
    const res = await create(engineer, { name: 'broken', service: 'legacy', url: url.replace('/stats', '/broken'), intervalSeconds: 30 });
    const target = (await collectionTargetsRepo.byId(t.db.knex, res.body.id))!;
    expect((await collectTarget(t.db.knex, target, Date.now())).error).toMatch(/HTTP 500/);
    const meta = await create(engineer, { name: 'metadata', service: 'legacy', url: 'http://169.254.169.254/latest/meta-data/', intervalSeconds: 30 });
    const m = (await collectionTargetsRepo.byId(t.db.knex, meta.body.id))!;
    expect((await collectTarget(t.db.knex, m, Date.now())).error).toMatch(/link-local/);
    // Without the admin's loopback allowance, a loopback endpoint is refused like a probe would be.
    await t.db.knex('settings').where({ key: 'target_policy' }).update({ value: JSON.stringify({ allowLoopback: false }) });
    const loopback = (await collectTarget(t.db.knex, target, Date.now())).error;
    expect(loopback).toMatch(/refused: 127\.0\.0\.1 .*loopback/);
    await t.db.knex('settings').where({ key: 'target_policy' }).update({ value: JSON.stringify({ allowLoopback: true }) });
  });

  it('runs due targets through pg-boss, each slot claimed once', async () => {
    await t.db.knex('collection_targets').update({ enabled: false });
    const res = await create(engineer, { name: 'queued', service: 'queued-app', url, intervalSeconds: 3600 });
    doc = { temperature: 21 };
    const boss = new PgBoss({ ...t.db.settings, schema: 'pgboss', max: 2 });
    boss.on('error', () => {});
    await boss.start();
    const stop = await startCollector(boss, t.db.knex, { tickMs: 200, maintenanceMs: 3_600_000, log: () => {} });
    try {
      let n = 0;
      for (let i = 0; i < 100 && n === 0; i++) {
        await new Promise((r) => setTimeout(r, 100));
        const r = await t.db.knex.raw(
          `SELECT count(*)::int AS n FROM samples s JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id WHERE g.name = 'temperature'`,
        );
        n = r.rows[0].n;
      }
      expect(n).toBe(1);
      const target = (await collectionTargetsRepo.byId(t.db.knex, res.body.id))!;
      // The next run moved a whole interval on, so this slot is not claimed again.
      expect(new Date(target.nextRunAt).getTime() - new Date(res.body.nextRunAt).getTime()).toBeGreaterThanOrEqual(3_600_000);
      // Maintenance ran too: tomorrow's partitions were made ahead of time.
      const tomorrow = new Date(Date.now() + 86_400_000).toISOString().slice(0, 10).replace(/-/g, '');
      let made = false;
      for (let i = 0; i < 100 && !made; i++) {
        made = (await t.db.knex.raw('SELECT to_regclass(?) IS NOT NULL AS ok', [`histogram_points_p${tomorrow}`])).rows[0].ok;
        if (!made) await new Promise((r) => setTimeout(r, 100));
      }
      expect(made).toBe(true);
    } finally {
      await stop();
      await boss.stop({ graceful: false, timeout: 2000 });
    }
  });
});
