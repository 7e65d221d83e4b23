import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';

let t: TestApp;
let admin: SignedIn;
let engineer: SignedIn;
let reviewer: SignedIn;

export function simpleJourney(overrides: Record<string, unknown> = {}) {
  return {
    name: 'Browse the catalogue',
    steps: [{ name: 'Home page', method: 'GET', url: 'http://127.0.0.1:9/', assertions: [{ kind: 'status', in: [200] }] }],
    schedule: { kind: 'interval', everySeconds: 60 },
    vantages: ['harbour'],
    ...overrides,
  };
}

beforeAll(async () => {
  t = await buildTestApp();
  admin = await signIn(t, (await addPerson(t, 'admin')).email);
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  reviewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
  await admin.agent.post('/api/vantages').set('x-csrf-token', admin.csrf).send({ name: 'harbour', region: 'west' }).expect(201);
});
afterAll(() => t.close());

const counts = async () => ({
  journeys: Number((await t.db.knex('journeys').count({ n: '*' }).first())!.n),
  versions: Number((await t.db.knex('journey_versions').count({ n: '*' }).first())!.n),
});

describe('journeys', () => {
  it('saves a new version on every save; old versions stay readable', async () => {
    const created = await engineer.agent.post('/api/journeys').set('x-csrf-token', engineer.csrf).send({ document: simpleJourney() });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ name: 'Browse the catalogue', version: 1, enabled: true });
    const id = created.body.id;
    const updated = await engineer.agent
      .put(`/api/journeys/${id}`)
      .set('x-csrf-token', engineer.csrf)
      .send({ document: simpleJourney({ name: 'Browse the whole catalogue', failureQuorum: 1 }) });
    expect(updated.status).toBe(200);
    expect(updated.body.version).toBe(2);

    const v1 = await reviewer.agent.get(`/api/journeys/${id}?version=1`).expect(200);
    expect(v1.body.document.name).toBe('Browse the catalogue');
    const cur = await reviewer.agent.get(`/api/journeys/${id}`).expect(200);
    expect(cur.body.document.name).toBe('Browse the whole catalogue');
    expect(cur.body.versions.map((v: { version: number }) => v.version)).toEqual([2, 1]);

    const list = await reviewer.agent.get('/api/journeys').expect(200);
    const row = list.body.items.find((j: { id: number }) => j.id === id);
    // No runs yet: the pass rate is unknown, not 0 % or 100 %.
    expect(row.passRate).toEqual({ passed: 0, total: 0, rate: null, low: null, high: null });
    expect(row.lastRun).toBeNull();
    expect(await t.db.knex('audit_events').whereIn('action', ['journey.create', 'journey.update']).where({ subject_id: String(id) })).toHaveLength(2);
  });

  it.each([
    [{ document: simpleJourney({ steps: [] }) }, 'document.steps'],
    [{ document: simpleJourney({ schedule: { kind: 'interval', everySeconds: 5 } }) }, 'document.schedule.everySeconds'],
    [{ document: simpleJourney({ schedule: { kind: 'cron', expression: '61 * * * *' } }) }, 'document.schedule.expression'],
    [{ document: simpleJourney({ vantages: ['nowhere'] }) }, 'document.vantages.0'],
    [{ document: simpleJourney({ failureQuorum: 2 }) }, 'document.failureQuorum'],
    [{ document: simpleJourney({ steps: [{ name: 'x', method: 'GET', url: 'ftp://example.test/' }] }) }, 'document.steps.0.url'],
    [{ document: simpleJourney({ steps: [{ name: 'x', method: 'GET', url: 'http://example.test/', headers: [{ name: 'Authorization', value: 'Bearer {{secret.MISSING}}' }] }] }) }, 'document.steps'],
    [{ document: simpleJourney(), serviceIds: [987654] }, 'serviceIds.0'],
  ])('refuses bad input naming the field (%#: %s)', async (body, field) => {
    const before = await counts();
    const res = await engineer.agent.post('/api/journeys').set('x-csrf-token', engineer.csrf).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expect(res.body.error.field).toBe(field);
    expect(await counts()).toEqual(before);
  });

  it('lets reviewers read but not write', async () => {
    const res = await reviewer.agent.post('/api/journeys').set('x-csrf-token', reviewer.csrf).send({ document: simpleJourney() });
    expect(res.status).toBe(403);
  });

  it('previews the next cron times (POSIX crontab: */15 in the minute field fires at :00, :15, :30, :45)', async () => {
    const res = await reviewer.agent
      .post('/api/journeys/schedule-preview')
      .set('x-csrf-token', reviewer.csrf)
      .send({ schedule: { kind: 'cron', expression: '*/15 * * * *' }, count: 5 });
    expect(res.status).toBe(200);
    expect(res.body.times).toHaveLength(5);
    for (const iso of res.body.times) expect([0, 15, 30, 45]).toContain(new Date(iso).getUTCMinutes());
    const gaps = res.body.times.slice(1).map((x: string, i: number) => Date.parse(x) - Date.parse(res.body.times[i]));
    expect(new Set(gaps)).toEqual(new Set([15 * 60_000]));
  });

  it('pages run history with a cursor and filters by verdict', async () => {
    const created = await engineer.agent.post('/api/journeys').set('x-csrf-token', engineer.csrf).send({ document: simpleJourney({ name: 'Paged' }) });
    const id = created.body.id;
    const base = Date.parse('2026-11-30T10:00:00Z');
    await t.db.knex.raw('SELECT ensure_run_partitions(?, ?)', [new Date(base), new Date(base + 3600_000)]);
    await t.db.knex('runs').insert(
      Array.from({ length: 7 }, (_, i) => ({
        journey_id: id,
        version: 1,
        vantage: 'harbour',
        slot_at: new Date(base + i * 60_000),
        verdict: i % 3 === 0 ? 'fail' : 'pass',
        duration_ms: 100 + i,
      })),
    );
    const p1 = await reviewer.agent.get(`/api/journeys/${id}/runs?limit=3`).expect(200);
    expect(p1.body.items.map((r: { slotAt: string }) => r.slotAt)).toEqual([6, 5, 4].map((i) => new Date(base + i * 60_000).toISOString()));
    const p2 = await reviewer.agent.get(`/api/journeys/${id}/runs?limit=3&cursor=${encodeURIComponent(p1.body.nextCursor)}`).expect(200);
    expect(p2.body.items.map((r: { slotAt: string }) => r.slotAt)).toEqual([3, 2, 1].map((i) => new Date(base + i * 60_000).toISOString()));
    const fails = await reviewer.agent.get(`/api/journeys/${id}/runs?verdict=fail`).expect(200);
    expect(fails.body.items).toHaveLength(3);
    const bad = await reviewer.agent.get(`/api/journeys/${id}/runs?cursor=nonsense`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.field).toBe('query.cursor');
  });
});
