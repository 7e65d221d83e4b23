// The JSON batch intake, the service and signal lists, and the query API on data whose answers
// are worked out by hand in each test.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';
import { makeToken } from './otlp-fixtures';

let t: TestApp;
let engineer: SignedIn;
let reviewer: SignedIn;
let ingestToken: string;
let readToken: string;
// A whole hour, so aligned steps fall on round instants.
const T0 = Date.UTC(2026, 2, 2, 10, 0, 0);

beforeAll(async () => {
  t = await buildTestApp();
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  reviewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
  ingestToken = await makeToken(t, ['ingest']);
  readToken = await makeToken(t, ['read'], 'reader');
});
afterAll(() => t.close());

type Point = Record<string, unknown>;
const send = (points: Point[]) => request(t.app).post('/api/signals/samples').set('authorization', `Bearer ${ingestToken}`).send({ points });
const query = (params: Record<string, string | number>) =>
  request(t.app)
    .get('/api/signals/query')
    .set('authorization', `Bearer ${readToken}`)
    .query(params);

describe('JSON batch intake', () => {
  it('names the failing field of the failing point and stores nothing from a bad batch', async () => {
    const good = { service: 'batch', signal: 'g', kind: 'gauge', labels: {}, t: T0, value: 1 };
    const res = await send([good, good, good, { ...good, value: 'high' }]);
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('points.3.value');
    const t2 = await send([{ ...good, t: 'last tuesday' }]);
    expect(t2.body.error.field).toBe('points.0.t');
    const k = await send([{ ...good, kind: 'summary' }]);
    expect(k.body.error.field).toBe('points.0.kind');
    expect(await t.db.knex('samples').count({ n: '*' }).first()).toEqual({ n: 0 });
  });

  it('stores points given as ms or ISO time, and counts re-sent ones as duplicates', async () => {
    const points = [
      { service: 'batch', signal: 'temp', kind: 'gauge', unit: 'Cel', labels: { room: 'a' }, t: T0, value: 20 },
      { service: 'batch', signal: 'temp', kind: 'gauge', unit: 'Cel', labels: { room: 'a' }, t: new Date(T0 + 60_000).toISOString(), value: 21 },
    ];
    expect((await send(points)).body).toEqual({ accepted: 2, duplicates: 0, rejected: 0, errors: [] });
    expect((await send(points)).body).toEqual({ accepted: 0, duplicates: 2, rejected: 0, errors: [] });
  });

  it('lets engineers and ingest tokens write, and refuses reviewers and read tokens', async () => {
    const p = [{ service: 'batch', signal: 'x', kind: 'gauge', labels: {}, t: T0, value: 1 }];
    expect((await engineer.agent.post('/api/signals/samples').set('x-csrf-token', engineer.csrf).send({ points: p })).status).toBe(200);
    expect((await reviewer.agent.post('/api/signals/samples').set('x-csrf-token', reviewer.csrf).send({ points: p })).status).toBe(403);
    expect((await request(t.app).post('/api/signals/samples').set('authorization', `Bearer ${readToken}`).send({ points: p })).status).toBe(403);
    expect((await request(t.app).post('/api/signals/samples').send({ points: p })).status).toBe(401);
  });
});

describe('services and signals lists', () => {
  it('lists services with signal counts and last sample time, and signals with kinds, units and label keys', async () => {
    await send([
      { service: 'listing', signal: 'requests', kind: 'counter', labels: { route: '/a', zone: 'z1' }, t: T0, value: 1 },
      { service: 'listing', signal: 'requests', kind: 'counter', labels: { route: '/b' }, t: T0 + 5000, value: 1 },
      { service: 'listing', signal: 'free', kind: 'gauge', unit: 'By', labels: {}, t: T0 + 9000, value: 5 },
    ]);
    const services = await reviewer.agent.get('/api/services').expect(200);
    expect(services.body.items.find((s: { name: string }) => s.name === 'listing')).toMatchObject({
      signalCount: 2,
      seriesCount: 3,
      lastSampleAt: new Date(T0 + 9000).toISOString(),
    });
    const signals = await reviewer.agent.get('/api/signals?service=listing').expect(200);
    expect(signals.body.items).toEqual([
      expect.objectContaining({ name: 'free', kind: 'gauge', unit: 'By', labelKeys: [], seriesCount: 1 }),
      expect.objectContaining({ name: 'requests', kind: 'counter', unit: '', labelKeys: ['route', 'zone'], seriesCount: 2, lastSampleAt: new Date(T0 + 5000).toISOString() }),
    ]);
    expect((await reviewer.agent.get('/api/signals?service=nope')).status).toBe(404);
  });

  it('lets engineers describe a service, recording it in the audit log', async () => {
    const created = await engineer.agent.post('/api/services').set('x-csrf-token', engineer.csrf).send({ name: 'payments', owner: 'team-pay' });
    expect(created.status).toBe(201);
    const dup = await engineer.agent.post('/api/services').set('x-csrf-token', engineer.csrf).send({ name: 'payments' });
    expect(dup.status).toBe(409);
    const patched = await engineer.agent.patch(`/api/services/${created.body.id}`).set('x-csrf-token', engineer.csrf).send({ description: 'card payments' });
    expect(patched.body).toMatchObject({ name: 'payments', owner: 'team-pay', description: 'card payments' });
    expect((await reviewer.agent.post('/api/services').set('x-csrf-token', reviewer.csrf).send({ name: 'x' })).status).toBe(403);
    expect(await t.db.knex('audit_events').whereIn('action', ['service.create', 'service.update']).count({ n: '*' }).first()).toEqual({ n: 2 });
  });
});

describe('query API', () => {
  beforeAll(async () => {
    // A counter sampled every 15 s that resets once: 0, 10, 20, then 5 (restart), 15, 25.
    const values = [0, 10, 20, 5, 15, 25];
    const pts: Point[] = values.map((v, i) => ({ service: 'shop', signal: 'requests', kind: 'counter', labels: { route: '/pay', zone: 'z1' }, t: T0 + i * 15_000, value: v }));
    // Same route in another zone: +3 per sample.
    values.forEach((_, i) => pts.push({ service: 'shop', signal: 'requests', kind: 'counter', labels: { route: '/pay', zone: 'z2' }, t: T0 + i * 15_000, value: 3 * i }));
    // A route with no traffic at all in the window.
    values.forEach((_, i) => pts.push({ service: 'shop', signal: 'requests', kind: 'counter', labels: { route: '/idle', zone: 'z1' }, t: T0 + i * 15_000, value: 7 }));
    // Errors on /pay z1 only: +1 per sample.
    values.forEach((_, i) => pts.push({ service: 'shop', signal: 'errors', kind: 'counter', labels: { route: '/pay', zone: 'z1' }, t: T0 + i * 15_000, value: i }));
    // Disk free falling 2 units per second, sampled every 10 s.
    for (let i = 0; i <= 9; i++) pts.push({ service: 'shop', signal: 'disk.free', kind: 'gauge', labels: { host: 'h1' }, t: T0 + i * 10_000, value: 1000 - 20 * i });
    // Six series of one gauge, for the size limits.
    for (let i = 0; i < 6; i++) pts.push({ service: 'shop', signal: 'wide', kind: 'gauge', labels: { i: String(i) }, t: T0, value: i });
    expect((await send(pts)).body.accepted).toBe(pts.length);
  });

  // One aligned instant, T0 + 75 s, whose window [T0, T0 + 75 s] holds all six samples.
  const one = { service: 'shop', from: T0 + 75_000, to: T0 + 75_000, step: '75s', window: '75s' };

  it('computes increase and rate with the reset counted from zero', async () => {
    const res = await query({ ...one, signal: 'requests', fn: 'increase', 'label.zone': 'z1', 'label.route': '/pay' });
    expect(res.status).toBe(200);
    // 10 + 10 + 5 (after the reset the new value is the growth) + 10 + 10 = 45.
    expect(res.body.groups).toEqual([{ labels: { route: '/pay', zone: 'z1' }, seriesIds: [expect.any(Number)], points: [{ t: T0 + 75_000, v: 45 }] }]);
    expect(res.body.series).toHaveLength(1);
    expect(res.body.samplingIntervalMs).toBe(15_000);
    const rate = await query({ ...one, signal: 'requests', fn: 'rate', by: 'route' });
    // Grouped by route: /pay = 45 + 15 (z2 grows 3 × 5) = 60 over 75 s; /idle = 0.
    expect(rate.body.groups.map((g: { labels: unknown; points: { v: number }[] }) => [g.labels, g.points[0]!.v])).toEqual([
      [{ route: '/idle' }, 0],
      [{ route: '/pay' }, 60 / 75],
    ]);
  });

  it('gives the error ratio per group, with "no traffic" kept apart from zero', async () => {
    const res = await query({ ...one, signal: 'errors', fn: 'ratio', denominator: 'requests', by: 'route' });
    expect(res.status).toBe(200);
    const byRoute = Object.fromEntries(res.body.groups.map((g: { labels: { route: string }; points: unknown[] }) => [g.labels.route, g.points[0]]));
    expect(byRoute['/pay']).toEqual({ t: T0 + 75_000, v: 5 / 60 });
    expect(byRoute['/idle']).toEqual({ t: T0 + 75_000, v: null, noTraffic: true });
  });

  it('refuses a window shorter than 2.5 sampling intervals, naming the minimum', async () => {
    const res = await query({ ...one, signal: 'requests', fn: 'rate', window: '30s' });
    expect(res.status).toBe(400);
    expect(res.body.error.field).toBe('query.window');
    expect(res.body.error.message).toMatch(/at least 37\.5 s/);
  });

  it('refuses results over the limits, naming them', async () => {
    const many = await query({ service: 'shop', signal: 'requests', fn: 'rate', from: T0, to: T0 + 86_400_000, step: '1s', window: '1m' });
    expect(many.status).toBe(400);
    expect(many.body.error.field).toBe('query.step');
    expect(many.body.error.message).toMatch(/limit of 11000/);
    const groups = await query({ service: 'shop', signal: 'wide', fn: 'last', from: T0, to: T0 + 10_000 * 20_000, step: '20s', window: '1m' });
    expect(groups.status).toBe(400);
    expect(groups.body.error.field).toBe('query.step');
    expect(groups.body.error.message).toMatch(/6 groups × 10001 points = 60006 points exceed the limit of 50000/);
  });

  it('refuses functions that do not fit the kind, and unknown signals', async () => {
    const r1 = await query({ ...one, signal: 'disk.free', fn: 'rate' });
    expect(r1.status).toBe(400);
    expect(r1.body.error.field).toBe('query.fn');
    expect((await query({ ...one, signal: 'nothing' })).status).toBe(404);
    const r3 = await query({ ...one, signal: 'requests', fn: 'quantile' });
    expect(r3.body.error.field).toBe('query.q');
    const r4 = await query({ ...one, signal: 'requests', label: 'x' });
    expect(r4.status).toBe(400);
  });

  it('aggregates gauges by sum or mean, and fits a trend with the time to a limit', async () => {
    const last = await query({ service: 'shop', signal: 'disk.free', fn: 'last', from: T0 + 90_000, to: T0 + 90_000, step: '90s', window: '30s', by: '' });
    expect(last.body.groups[0].points[0]).toEqual({ t: T0 + 90_000, v: 820 });
    const trend = await query({ service: 'shop', signal: 'disk.free', fn: 'trend', from: T0 + 90_000, to: T0 + 90_000, step: '90s', window: '90s', limit: 100 });
    const p = trend.body.groups[0].points[0];
    // An exact line: slope −2 per second, level 820 at t; 820 → 100 at −2/s takes 360 s.
    expect(p.v).toBeCloseTo(-2, 10);
    expect(p.level).toBeCloseTo(820, 8);
    expect(p.timeToLimitSeconds).toBeCloseTo(360, 6);
  });

  it('returns raw samples per series', async () => {
    const res = await query({ service: 'shop', signal: 'errors', fn: 'raw', from: T0, to: T0 + 30_000 });
    expect(res.body.groups[0].points).toEqual([
      { t: T0, v: 0 },
      { t: T0 + 15_000, v: 1 },
      { t: T0 + 30_000, v: 2 },
    ]);
  });

  it('lets every signed-in role and read tokens query, not anonymous callers', async () => {
    expect((await reviewer.agent.get('/api/signals/query').query({ ...one, signal: 'requests' })).status).toBe(200);
    expect((await request(t.app).get('/api/signals/query').query({ ...one, signal: 'requests' })).status).toBe(401);
    expect((await request(t.app).get('/api/signals/query').set('authorization', `Bearer ${ingestToken}`).query({ ...one, signal: 'requests' })).status).toBe(403);
  });
});

describe('query API on histograms', () => {
  // Grouped-data median, NCERT Mathematics Class X, ch. 14 "Statistics", Example 7 (printed):
  // classes below 140: 4; 140–145: 7; 145–150: 18; 150–155: 11; 155–160: 6; 160–165: 5; N = 51
  // → median = 145 + (25.5 − 11)/18 · 5 = 149.03.
  beforeAll(async () => {
    const bounds = [140, 145, 150, 155, 160, 165];
    const pts: Point[] = [
      { service: 'school', signal: 'height', kind: 'histogram', labels: {}, t: T0, bounds, counts: [0, 0, 0, 0, 0, 0, 0] },
      { service: 'school', signal: 'height', kind: 'histogram', labels: {}, t: T0 + 30_000, bounds, counts: [4, 7, 18, 11, 6, 5, 0] },
    ];
    expect((await send(pts)).body.accepted).toBe(2);
  });
  const at = { service: 'school', signal: 'height', from: T0 + 60_000, to: T0 + 60_000, step: '60s', window: '90s' };

  it('interpolates the median inside its bucket (NCERT Class X Example 7 → 149.03)', async () => {
    const res = await query({ ...at, fn: 'quantile', q: 0.5 });
    expect(res.status).toBe(200);
    expect(res.body.groups[0].points[0].v).toBeCloseTo(149.03, 2);
  });

  it('gives the exact share of observations above an explicit bound', async () => {
    const res = await query({ ...at, fn: 'share_above', bound: 150 });
    // 11 + 6 + 5 = 22 of 51 lie above 150 (exact on the bucket data).
    expect(res.body.groups[0].points[0].v).toBeCloseTo(22 / 51, 12);
  });
});
