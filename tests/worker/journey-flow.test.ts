// Scheduler → pg-boss → prober → runs, against the demo target on loopback and a real database.
import { spawn } from 'node:child_process';
import crypto from 'node:crypto';
import path from 'node:path';
import type PgBoss from 'pg-boss';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { nextSlots } from '../../shared/journey/schedule';
import { journeysService } from '../../server/services/journeys';
import { startDemoTarget, type DemoTarget } from '../../scripts/demo-target';
import { startBoss } from '../../worker/boss';
import { startProber } from '../../worker/probe-job';
import { createScheduler, slotJobId } from '../../worker/scheduler';
import { createTestDb, type TestDb } from '../helpers/db';

let db: TestDb;
let target: DemoTarget;
let boss: PgBoss;
const key = crypto.randomBytes(32);
const actor = { type: 'token' as const, id: 0, name: 'test-suite', scopes: [] };
const cleanups: (() => Promise<unknown>)[] = [];

beforeAll(async () => {
  db = await createTestDb();
  target = await startDemoTarget({ port: 0 });
  // Supervision every second, so an abandoned job expires quickly in the kill test.
  boss = await startBoss(db.settings, { maintenanceIntervalSeconds: 1, monitorStateIntervalSeconds: 1 } as Partial<PgBoss.ConstructorOptions>);
  await db.knex('settings').insert({ key: 'target_policy', value: JSON.stringify({ allowLoopback: true }) });
  await db.knex('vantages').insert([{ name: 'quay' }, { name: 'ridge' }]);
});
afterEach(async () => {
  while (cleanups.length) await cleanups.pop()!();
  await target.control({ addedLatencyMs: 0, errorRate: 0 });
});
afterAll(async () => {
  await boss.stop({ graceful: false, wait: true });
  await target.close();
  await db.drop();
});

async function journey(name: string, vantages: string[], timeoutMs = 5000) {
  const j = await journeysService(db.knex).create(
    actor,
    {
      name,
      steps: [
        {
          name: 'Search teas',
          method: 'GET',
          url: `${target.url}/api/search?q=oolong`,
          headers: [],
          timeoutMs,
          followRedirects: false,
          maxRedirects: 5,
          assertions: [{ kind: 'status', in: [200] }],
          captures: [],
        },
      ],
      schedule: { kind: 'interval', everySeconds: 10 },
      vantages,
      failureQuorum: 1,
      enabled: true,
    },
    [],
  );
  return j;
}

/** The most recent slot at or before now, and a clock pinned just after it. */
function lastSlot(id: number) {
  const s = nextSlots({ kind: 'interval', everySeconds: 10 }, id, new Date(Date.now() - 10_000), 1)[0]!;
  return { slot: s, clock: () => new Date(s.getTime() + 500) };
}

async function waitFor<T>(fn: () => Promise<T | undefined | null>, ms = 30_000): Promise<T> {
  const end = Date.now() + ms;
  for (;;) {
    const v = await fn();
    if (v !== undefined && v !== null) return v;
    if (Date.now() > end) throw new Error('timed out waiting');
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('scheduler and prober', () => {
  it('turns a due slot into one run per vantage with step timings and a trace id', async () => {
    await db.knex('scheduler_state').delete();
    const j = await journey('Search from two places', ['quay', 'ridge']);
    const stopQ = await startProber(boss, db.knex, { vantage: 'quay', secretKey: key, concurrency: 1 });
    const stopR = await startProber(boss, db.knex, { vantage: 'ridge', secretKey: key, concurrency: 1 });
    cleanups.push(stopQ, stopR);
    const { slot, clock } = lastSlot(j.id);
    const s = createScheduler(boss, db.knex, db.settings, { now: clock, log: () => {} });
    cleanups.push(() => s.stop());
    const tick = await s.tick();
    expect(tick).toMatchObject({ leader: true, queued: 2, missed: 0 });
    const runs = await waitFor(async () => {
      const r = await db.knex('runs').where({ journey_id: j.id });
      return r.length === 2 ? r : undefined;
    });
    expect(runs.map((r) => r.vantage).sort()).toEqual(['quay', 'ridge']);
    for (const r of runs) {
      expect(r.verdict).toBe('pass');
      expect(r.slot_at.toISOString()).toBe(slot.toISOString());
    }
    const steps = await db.knex('step_results').whereIn('run_id', runs.map((r) => r.id));
    expect(steps).toHaveLength(2);
    for (const st of steps) {
      expect(st.http_status).toBe(200);
      expect(st.trace_id).toMatch(/^[0-9a-f]{32}$/);
      expect(st.timings.ttfbMs).toBeLessThanOrEqual(st.timings.totalMs);
    }
  });

  it('never doubles a slot: a second scheduler waits its turn and re-sending a slot is refused', async () => {
    await db.knex('scheduler_state').delete();
    const j = await journey('Only once', ['quay']);
    const { slot, clock } = lastSlot(j.id);
    const a = createScheduler(boss, db.knex, db.settings, { now: clock, log: () => {} });
    const b = createScheduler(boss, db.knex, db.settings, { now: clock, log: () => {} });
    cleanups.push(() => a.stop(), () => b.stop());
    const [ra, rb] = await Promise.all([a.tick(), b.tick()]);
    expect([ra.leader, rb.leader].filter(Boolean)).toHaveLength(1);
    // The leader stops; the other takes over and replays the same window from scratch.
    const [leader, other] = ra.leader ? [a, b] : [b, a];
    await leader.stop();
    await db.knex('scheduler_state').delete();
    const again = await other.tick();
    expect(again.leader).toBe(true);
    expect(again.queued).toBe(0); // same job id → pg-boss refuses the duplicate
    const job = await boss.getJobById('probe.quay', slotJobId(j.id, 'quay', slot));
    expect(job).not.toBeNull();

    const stop = await startProber(boss, db.knex, { vantage: 'quay', secretKey: key, concurrency: 2 });
    cleanups.push(stop);
    await waitFor(() => db.knex('runs').where({ journey_id: j.id }).first());
    await new Promise((r) => setTimeout(r, 1500));
    expect(await db.knex('runs').where({ journey_id: j.id })).toHaveLength(1);
  });

  it('records slots missed during downtime as void once, without replaying them', async () => {
    const j = await journey('After an outage', ['ridge']);
    const now = new Date();
    await db.knex('scheduler_state').insert({ id: 'scheduler', last_tick_at: new Date(now.getTime() - 5 * 60_000) }).onConflict('id').merge();
    const s = createScheduler(boss, db.knex, db.settings, { now: () => now, log: () => {} });
    cleanups.push(() => s.stop());
    const first = await s.tick();
    const missed = await db.knex('runs').where({ journey_id: j.id, trigger: 'missed' });
    // 5 minutes of 10 s slots, less the last minute (still runnable): 24 slots, give or take the edge.
    expect(missed.length).toBeGreaterThanOrEqual(23);
    expect(missed.length).toBeLessThanOrEqual(25);
    // Every enabled journey missed the same stretch; this tick recorded all of them, once.
    expect(first.missed).toBe(Number((await db.knex("runs").where({ trigger: "missed" }).count({ n: "*" }).first())!.n));
    expect(new Set(missed.map((r) => r.verdict))).toEqual(new Set(['void']));
    expect(missed.every((r) => /no scheduler/.test(r.void_reason))).toBe(true);
    await db.knex('scheduler_state').update({ last_tick_at: new Date(now.getTime() - 5 * 60_000) });
    const second = await s.tick();
    expect(second.missed).toBe(0);
  });

  it('leaves exactly one stored run when a worker is killed mid-run (kill -9) and the job is retried', async () => {
    await db.knex('scheduler_state').delete();
    const j = await journey('Survives a crash', ['ridge'], 3000);
    await target.control({ addedLatencyMs: 2000 });
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(__dirname, 'fixtures/probe-worker.ts')], {
      env: { ...process.env, PX_DB_SETTINGS: JSON.stringify(db.settings), PX_VANTAGE: 'ridge', PX_SECRET_KEY: key.toString('hex') },
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    cleanups.push(async () => {
      if (child.exitCode === null) child.kill('SIGKILL');
    });
    await new Promise<void>((resolve, reject) => {
      child.stdout!.on('data', (d: Buffer) => d.toString().includes('ready') && resolve());
      child.once('exit', () => reject(new Error('worker exited early')));
    });
    const { slot, clock } = lastSlot(j.id);
    const s = createScheduler(boss, db.knex, db.settings, { now: clock, log: () => {} });
    cleanups.push(() => s.stop());
    await s.tick();
    const id = slotJobId(j.id, 'ridge', slot);
    await waitFor(async () => ((await boss.getJobById('probe.ridge', id))?.state === 'active' ? true : undefined));
    await new Promise((r) => setTimeout(r, 300)); // mid-request: the target holds the answer 2 s
    child.kill('SIGKILL');
    await new Promise((r) => child.once('exit', r));
    expect(await db.knex('runs').where({ journey_id: j.id })).toHaveLength(0);

    await target.control({ addedLatencyMs: 0 });
    const stop = await startProber(boss, db.knex, { vantage: 'ridge', secretKey: key, concurrency: 1 });
    cleanups.push(stop);
    const run = await waitFor(() => db.knex('runs').where({ journey_id: j.id }).first(), 40_000);
    expect(run.slot_at.toISOString()).toBe(slot.toISOString());
    const job = await boss.getJobById('probe.ridge', id);
    expect(job!.retryCount).toBeGreaterThanOrEqual(1);
    await new Promise((r) => setTimeout(r, 1000));
    expect(await db.knex('runs').where({ journey_id: j.id })).toHaveLength(1);
  }, 60_000);
});
