// The worker's heartbeat goes through a real pg-boss queue on the test database and shows on the API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startBoss } from '../../worker/boss';
import { startHeartbeat } from '../../worker/heartbeat';
import { addPerson, buildTestApp, signIn, type TestApp } from '../helpers/app';
import type PgBoss from 'pg-boss';

let t: TestApp;
let boss: PgBoss;
let stop: () => Promise<void>;

beforeAll(async () => {
  t = await buildTestApp();
  boss = await startBoss(t.db.settings);
  stop = await startHeartbeat(boss, t.db.knex, { name: 'vantage-test', beatSeconds: 1 });
});
afterAll(async () => {
  await stop();
  await boss.stop({ graceful: false, wait: true });
  await t.close();
});

async function waitFor<T>(fn: () => Promise<T | undefined>, ms = 15_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined) return v;
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('worker heartbeat', () => {
  it('records beats through the queue, one row per worker, and the API shows it up', async () => {
    const first = await waitFor(() => t.db.knex('worker_heartbeats').where({ name: 'vantage-test' }).first());
    const later = await waitFor(async () => {
      const r = await t.db.knex('worker_heartbeats').where({ name: 'vantage-test' }).first();
      return r.last_beat_at > first.last_beat_at ? r : undefined;
    });
    expect(later.pid).toBe(process.pid);
    expect(await t.db.knex('worker_heartbeats').count({ n: '*' }).first()).toEqual({ n: 1 });
    const jobs = await t.db.knex.raw("SELECT count(*)::int AS n FROM pgboss.job WHERE name = 'worker.heartbeat' AND state = 'completed'");
    expect(jobs.rows[0].n).toBeGreaterThanOrEqual(2);

    const viewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
    const res = await viewer.agent.get('/api/workers').expect(200);
    expect(res.body.items).toEqual([expect.objectContaining({ name: 'vantage-test', up: true })]);
  });

  it('shows a silent worker as down', async () => {
    // Same data, a clock 10 beats ahead: the server must call it down.
    const future = await buildTestApp();
    try {
      await future.db.knex('worker_heartbeats').insert({
        name: 'quiet-one',
        host: 'h',
        pid: 1,
        started_at: new Date(Date.now() - 60_000),
        last_beat_at: new Date(Date.now() - 10_000),
        beat_seconds: 1,
      });
      const viewer = await signIn(future, (await addPerson(future, 'engineer')).email);
      const res = await viewer.agent.get('/api/workers').expect(200);
      expect(res.body.items).toEqual([expect.objectContaining({ name: 'quiet-one', up: false })]);
    } finally {
      await future.close();
    }
  });
});
