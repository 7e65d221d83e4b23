// The evaluator on a real database with an injected clock (no sleeps): sustain, clear time, no
// data, maintenance windows, a restart mid-pending, one leader, and the outbox + jobs written in
// the same transaction as each state change. Each test has its own database (world()).
import { afterEach, describe, expect, it } from 'vitest';
import { startEvaluator } from '../../../worker/evaluator/evaluator';
import { NOTE, samples, store, T0, thresholdDraft } from '../../api/rules/seed';
import { world, type World } from './world';

const MIN = 60_000;
let w: World | null = null;
afterEach(async () => {
  await w?.close();
  w = null;
});

/** Disk free: 50, but 5 during [dipFrom, dipTo) (minutes after T0), sampled every 15 s from T0 − 10 min. */
async function disk(world: World, dipFrom: number, dipTo: number, opts: { until?: number; host?: string } = {}) {
  await store(
    world.t.db.knex,
    samples('checkout', 'disk_free', 'gauge', { host: opts.host ?? 'h1' }, T0 - 10 * MIN, opts.until ?? T0 + 30 * MIN, (t) => (t >= T0 + dipFrom * MIN && t < T0 + dipTo * MIN ? 5 : 50)),
  );
}

async function alertRows(world: World) {
  return world.t.db.knex('alerts').orderBy('id').select('*');
}
async function outbox(world: World) {
  return world.t.db.knex('notification_outbox').orderBy('id').select('*');
}

describe('evaluator', () => {
  it('raises after the sustain time, clears only after the clear time, and queues one notification per transition', async () => {
    w = await world();
    await disk(w, 5, 10);
    const ruleId = await w.createRule(thresholdDraft({ groupBy: ['host'], sustain: '1m', clear: '1m' }));
    const seen: Array<[number, string]> = [];
    await w.cycles(T0, T0 + 15 * MIN, async (at) => {
      const open = (await alertRows(w!)).find((a) => a.state !== 'cleared');
      const state = open?.state ?? 'ok';
      if (seen.length === 0 || seen[seen.length - 1]![1] !== state) seen.push([(at - T0) / 1000, state]);
    });
    // Below 10 from +5 min: pending, raised 60 s later; fine again from +10 min, cleared 60 s later.
    expect(seen).toEqual([
      [0, 'ok'],
      [300, 'pending'],
      [360, 'raised'],
      [660, 'ok'],
    ]);
    const [a] = await alertRows(w);
    expect(a).toMatchObject({ rule_id: ruleId, state: 'cleared', labels: { host: 'h1' }, end_reason: 'cleared', planned: false, raise_notified: true });
    expect(a.pending_since.getTime()).toBe(T0 + 5 * MIN);
    expect(a.raised_at.getTime()).toBe(T0 + 6 * MIN);
    expect(a.cleared_at.getTime()).toBe(T0 + 11 * MIN);
    const events = await w.t.db.knex('alert_events').where({ alert_id: a.id }).orderBy('id').select('transition', 'state', 'at');
    expect(events.map((e) => [e.transition, e.state, (e.at.getTime() - T0) / 1000])).toEqual([
      ['pending', 'pending', 300],
      ['raised', 'raised', 360],
      ['cleared', 'cleared', 660],
    ]);

    // One mail per notified transition (pending is not notified), each with its delivery job.
    const rows = await outbox(w);
    expect(rows.map((r) => [r.transition, r.channel, r.recipients, r.status])).toEqual([
      ['raised', 'mail', ['ops@example.test'], 'pending'],
      ['cleared', 'mail', ['ops@example.test'], 'pending'],
    ]);
    expect(rows[0].payload).toMatchObject({ responderNote: NOTE, ruleName: 'Disk nearly full', labels: { host: 'h1' }, value: 5, transition: 'raised', severity: 'page' });
    const jobs = await w.t.db.knex.raw("SELECT data FROM pgboss.job WHERE name = 'rules.notify-mail' ORDER BY created_on");
    expect(jobs.rows.map((j: { data: { outboxId: number } }) => j.data.outboxId).sort()).toEqual(rows.map((r) => r.id));

    // The alerts API shows it in history with its note, and its detail charts it with its spans.
    const list = await w.engineer.agent.get('/api/alerts').expect(200);
    expect(list.body.now).toEqual([]);
    expect(list.body.history).toMatchObject([{ id: a.id, state: 'cleared', responderNote: NOTE, labels: { host: 'h1' }, ruleName: 'Disk nearly full' }]);
    w.clock.now = T0 + 20 * MIN;
    const detail = await w.engineer.agent.get(`/api/alerts/${a.id}`).expect(200);
    expect(detail.body.spans).toEqual([
      { state: 'pending', from: new Date(T0 + 5 * MIN).toISOString(), to: new Date(T0 + 6 * MIN).toISOString() },
      { state: 'raised', from: new Date(T0 + 6 * MIN).toISOString(), to: new Date(T0 + 11 * MIN).toISOString() },
    ]);
    const points = detail.body.series.points as Array<{ t: number; v: number | null }>;
    expect(points.find((p) => p.t === T0 + 7 * MIN)?.v).toBe(5);
    expect(points.find((p) => p.t === T0 + 12 * MIN)?.v).toBe(50);
  });

  it('shows no data as its own state: a raised alert is held, never silently cleared, and resumes', async () => {
    w = await world();
    // Low from +2 min on, but the series stops reporting between +6 and +9 min.
    await store(w.t.db.knex, [
      ...samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0 - 10 * MIN, T0 + 6 * MIN, (t) => (t >= T0 + 2 * MIN ? 5 : 50)),
      ...samples('checkout', 'disk_free', 'gauge', { host: 'h1' }, T0 + 9 * MIN, T0 + 20 * MIN, (t) => (t >= T0 + 12 * MIN ? 50 : 5)),
    ]);
    await w.createRule(thresholdDraft({ sustain: '30s', clear: '30s' }));
    const states: Array<[number, string, boolean]> = [];
    await w.cycles(T0, T0 + 15 * MIN, async (at) => {
      const open = (await alertRows(w!)).find((a) => a.state !== 'cleared');
      const s = open?.state ?? 'ok';
      const held = !!open?.held_raised;
      const last = states[states.length - 1];
      if (!last || last[1] !== s || last[2] !== held) states.push([(at - T0) / 1000, s, held]);
    });
    expect(states).toEqual([
      [0, 'ok', false],
      [120, 'pending', false],
      [150, 'raised', false],
      [435, 'no_data', true], // the 60 s window is empty from +7:15
      [540, 'raised', false], // data back at +9 min, still low
      [750, 'ok', false], // fine from +12 min, cleared 30 s later
    ]);
    const [a] = await alertRows(w);
    expect(a.end_reason).toBe('cleared');
    const events = await w.t.db.knex('alert_events').where({ alert_id: a.id }).orderBy('id').pluck('transition');
    expect(events).toEqual(['pending', 'raised', 'no_data', 'data_back', 'cleared']);
    // People hear of the raise, of the data going missing under it, and of the clear: nothing else.
    expect((await outbox(w)).map((r) => r.transition)).toEqual(['raised', 'no_data', 'cleared']);
  });

  it('shows a rule whose service sends nothing as no data, not as fine', async () => {
    w = await world();
    await disk(w, 100, 100, { until: T0 });
    await w.createRule(thresholdDraft());
    await w.cycleAt(T0 + 30 * MIN);
    const [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'no_data', no_data_reason: 'no_data', labels: {} });
    const list = await w.engineer.agent.get('/api/alerts').expect(200);
    expect(list.body.now).toMatchObject([{ state: 'no_data', noDataReason: 'no_data', responderNote: NOTE }]);
    expect(await outbox(w)).toEqual([]);
  });

  it('keeps evaluating during a maintenance window but sends nothing, marks the alert planned, and tells people if it outlasts the window', async () => {
    w = await world();
    await disk(w, 2, 20);
    await w.createRule(thresholdDraft({ sustain: '30s', clear: '30s' }));
    const mw = await w.engineer.agent
      .post('/api/maintenance-windows')
      .set('x-csrf-token', w.engineer.csrf)
      .send({ service: 'checkout', startsAt: new Date(T0).toISOString(), endsAt: new Date(T0 + 10 * MIN).toISOString(), reason: 'disk migration' });
    expect(mw.status).toBe(201);
    await w.cycles(T0, T0 + 9 * MIN);
    let [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'raised', planned: true, raise_notified: false });
    expect(await outbox(w)).toEqual([]);
    // The window ends with the disk still low: the raise is sent now, once.
    await w.cycles(T0 + 10 * MIN, T0 + 12 * MIN);
    [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'raised', planned: true, raise_notified: true });
    expect((await outbox(w)).map((r) => r.transition)).toEqual(['raised']);

    // A clear during a window is recorded, not sent.
    await w.t.db.knex('maintenance_windows').update({ ends_at: new Date(T0 + 60 * MIN) });
    await w.cycles(T0 + 12 * MIN + 15_000, T0 + 25 * MIN);
    [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'cleared', planned: true });
    expect((await outbox(w)).map((r) => r.transition)).toEqual(['raised']);
  });

  it('keeps pending-since across an evaluator restart (the state is in PostgreSQL)', async () => {
    w = await world();
    await disk(w, 5, 20);
    await w.createRule(thresholdDraft({ sustain: '2m' }));
    await w.cycles(T0 + 5 * MIN, T0 + 6 * MIN);
    let [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'pending' });
    expect(a.pending_since.getTime()).toBe(T0 + 5 * MIN);

    await w.restartEvaluator();
    await w.cycleAt(T0 + 6 * MIN + 45_000);
    [a] = await alertRows(w);
    expect(a.state).toBe('pending');
    await w.cycleAt(T0 + 7 * MIN);
    [a] = await alertRows(w);
    expect(a).toMatchObject({ state: 'raised' });
    expect(a.pending_since.getTime()).toBe(T0 + 5 * MIN);
    expect(a.raised_at.getTime()).toBe(T0 + 7 * MIN);
    expect(await w.t.db.knex('alerts').count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('lets one evaluator lead at a time', async () => {
    w = await world();
    const second = await startEvaluator(w.boss, w.t.db.knex, { now: () => new Date(T0), autoStart: false, log: () => {} });
    try {
      expect(await w.evaluator.runCycle()).not.toBeNull();
      expect(await second.runCycle()).toBeNull();
      await w.evaluator.stop();
      expect(await second.runCycle()).not.toBeNull();
    } finally {
      await second.stop();
    }
  });

  it('ends open alerts when the rule changes or is disabled, and drops nothing it should keep', async () => {
    w = await world();
    await disk(w, 0, 30);
    const id = await w.createRule(thresholdDraft({ sustain: 0 }));
    await w.cycleAt(T0 + MIN);
    expect((await alertRows(w))[0].state).toBe('raised');
    // A new note keeps the alert; a new threshold ends it (it was judged by the old one).
    await w.engineer.agent.put(`/api/rules/${id}`).set('x-csrf-token', w.engineer.csrf).send(thresholdDraft({ sustain: 0, responderNote: 'Call storage.' })).expect(200);
    expect((await alertRows(w))[0].state).toBe('raised');
    await w.engineer.agent.put(`/api/rules/${id}`).set('x-csrf-token', w.engineer.csrf).send(thresholdDraft({ sustain: 0, threshold: 4 })).expect(200);
    expect(await alertRows(w)).toMatchObject([{ state: 'cleared', end_reason: 'rule_changed' }]);
    await w.cycleAt(T0 + 2 * MIN);
    expect(await alertRows(w)).toHaveLength(1); // 5 is not below 4
  });
});
