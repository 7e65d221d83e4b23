// /api/rules: create, read, change, enable/disable, duplicate, delete, replay; bad rules are
// refused with a 400 naming the field and nothing written; every change is audited.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';
import { histogramPoints, makeToken, NOTE, samples, store, T0, thresholdDraft } from './seed';

let t: TestApp;
let engineer: SignedIn;
let reviewer: SignedIn;
let readToken: string;

beforeAll(async () => {
  t = await buildTestApp({ now: () => new Date(T0 + 3_600_000) });
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  reviewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
  readToken = await makeToken(t, ['read']);
  // Two hours of a disk gauge every 15 s: 50 free, dipping to 5 between +20 and +35 min.
  await store(t.db.knex, [
    ...samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0 - 3_600_000, T0 + 3_600_000, (x) => (x >= T0 + 20 * 60_000 && x < T0 + 35 * 60_000 ? 5 : 50)),
    ...samples('checkout', 'http_requests', 'counter', { zone: 'a' }, T0 - 600_000, T0, (x) => (x - (T0 - 600_000)) / 100),
    ...histogramPoints('checkout', 'latency', {}, [0.1, 0.5], T0 - 600_000, T0, () => [1, 1, 0]),
  ]);
});
afterAll(() => t.close());

const post = (who: SignedIn, path: string, body?: object) => who.agent.post(path).set('x-csrf-token', who.csrf).send(body);
const auditActions = async () => t.db.knex('audit_events').where('subject_type', 'alert_rule').orderBy('id').pluck('action');

describe('rules API', () => {
  it('refuses bad rules with a 400 naming the field, and writes nothing', async () => {
    const cases: Array<[Record<string, unknown>, string, RegExp?]> = [
      [thresholdDraft({ responderNote: '' }), 'responderNote'],
      [thresholdDraft({ responderNote: '   ' }), 'responderNote'],
      // Samples every 15 s: the smallest window is 2.5 × 15 s = 37.5 s, and the message says so.
      [thresholdDraft({ window: '30s' }), 'window', /37\.5 s/],
      [thresholdDraft({ signal: 'disk_fre' }), 'signal', /no signal named disk_fre/],
      [thresholdDraft({ service: 'nowhere' }), 'service'],
      // A quantile needs a histogram; disk_free is a gauge.
      [{ ...thresholdDraft(), kind: 'latency_quantile', quantile: 0.99, op: '>', threshold: 1 }, 'signal', /histogram.*gauge/],
      [{ ...thresholdDraft({ signal: 'http_requests' }), kind: 'error_ratio', requestsSignal: 'disk_free', op: '>', threshold: 0.1 }, 'requestsSignal', /counter.*gauge/],
      [{ ...thresholdDraft(), signal: 'http_requests' }, 'signal', /gauge.*counter/],
      [thresholdDraft({ channelIds: [4242] }), 'channelIds'],
      [thresholdDraft({ severity: 'sev1' }), 'severity'],
      [thresholdDraft({ runbookUrl: 'file:///etc/passwd' }), 'runbookUrl'],
    ];
    for (const [body, field, message] of cases) {
      const res = await post(engineer, '/api/rules', body);
      expect(res.status, `${field}: ${JSON.stringify(res.body)}`).toBe(400);
      expect(res.body.error.field).toBe(field);
      if (message) expect(res.body.error.message).toMatch(message);
    }
    expect(await t.db.knex('alert_rules').count({ n: '*' }).first()).toEqual({ n: 0 });
    expect(await auditActions()).toEqual([]);
  });

  it('creates, reads, changes, disables, duplicates and deletes a rule, auditing each change', async () => {
    const created = await post(engineer, '/api/rules', thresholdDraft({ runbookUrl: 'https://wiki.example.test/disk' }));
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    expect(created.body).toMatchObject({
      name: 'Disk nearly full',
      kind: 'threshold',
      service: 'checkout',
      enabled: true,
      severity: 'page',
      version: 1,
      open: { pending: 0, raised: 0, noData: 0 },
      document: { window: 60, sustain: 60, clear: 30, responderNote: NOTE, runbookUrl: 'https://wiki.example.test/disk', recipients: ['ops@example.test'] },
    });
    expect(created.body.condition).toContain('disk_free');
    const id = created.body.id;

    expect((await reviewer.agent.get(`/api/rules/${id}`)).body.name).toBe('Disk nearly full');
    const byToken = await request(t.app).get('/api/rules').set('authorization', `Bearer ${readToken}`).expect(200);
    expect(byToken.body.items.map((r: { id: number }) => r.id)).toEqual([id]);

    const changed = await engineer.agent.put(`/api/rules/${id}`).set('x-csrf-token', engineer.csrf).send(thresholdDraft({ threshold: 20 }));
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ version: 2, document: { threshold: 20, runbookUrl: null } });
    // A new note does not change when the rule holds: the version stays.
    const renoted = await engineer.agent.put(`/api/rules/${id}`).set('x-csrf-token', engineer.csrf).send(thresholdDraft({ threshold: 20, responderNote: 'Page the storage team.' }));
    expect(renoted.body).toMatchObject({ version: 2, document: { responderNote: 'Page the storage team.' } });

    expect((await post(engineer, `/api/rules/${id}/disable`)).body.enabled).toBe(false);
    expect((await post(engineer, `/api/rules/${id}/enable`)).body.enabled).toBe(true);
    const copy = await post(engineer, `/api/rules/${id}/duplicate`);
    expect(copy.status).toBe(201);
    expect(copy.body).toMatchObject({ name: 'Disk nearly full (copy)', enabled: false, document: { threshold: 20, enabled: false } });
    expect((await post(engineer, `/api/rules/${id}/duplicate`)).body.name).toBe('Disk nearly full (copy 2)');
    expect((await engineer.agent.get('/api/rules?enabled=false')).body.items).toHaveLength(2);

    expect((await engineer.agent.delete(`/api/rules/${copy.body.id}`).set('x-csrf-token', engineer.csrf)).status).toBe(204);
    expect((await engineer.agent.get(`/api/rules/${copy.body.id}`)).status).toBe(404);
    expect((await engineer.agent.delete(`/api/rules/${copy.body.id}`).set('x-csrf-token', engineer.csrf)).status).toBe(404);
    expect((await engineer.agent.get('/api/rules')).body.items).toHaveLength(2);

    expect(await auditActions()).toEqual(['rule.create', 'rule.update', 'rule.update', 'rule.disable', 'rule.enable', 'rule.duplicate', 'rule.duplicate', 'rule.delete']);
  });

  it('replays a draft over history with the evaluator computation: values, spans and raises', async () => {
    const res = await post(engineer, '/api/rules/replay', { rule: thresholdDraft(), from: T0, to: T0 + 3_600_000, step: '15s' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ from: T0, to: T0 + 3_600_000, stepMs: 15_000, raisedCount: 1, service: 'checkout', signal: 'disk_free', samplingIntervalMs: 15_000 });
    const [g] = res.body.groups;
    expect(g.labels).toEqual({});
    expect(g.points).toHaveLength(241);
    const min = (m: number) => T0 + m * 60_000;
    // Below 10 from +20 min; raised after the 1 min sustain; back at 50 from +35 min, cleared 30 s later.
    expect(g.spans).toEqual([
      { state: 'pending', from: min(20), to: min(21) },
      { state: 'raised', from: min(21), to: min(35) + 30_000 },
    ]);
    expect(g.points[0]).toEqual({ t: T0, v: 50, state: 'ok' });

    // Default period: the 7 days before now, at a step that keeps the answer bounded.
    const week = await post(engineer, '/api/rules/replay', { rule: thresholdDraft() });
    expect(week.status).toBe(200);
    expect(week.body.to - week.body.from).toBe(7 * 86_400_000);
    expect(week.body.raisedCount).toBe(1);

    const bad = await post(engineer, '/api/rules/replay', { rule: thresholdDraft({ window: '20s' }) });
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('rule.window');
    const note = await post(engineer, '/api/rules/replay', { rule: thresholdDraft({ responderNote: '' }) });
    expect(note.body.error.field).toBe('rule.responderNote');
    expect((await post(reviewer, '/api/rules/replay', { rule: thresholdDraft() })).status).toBe(403);
  });
});
