// "Try it now": the draft runs once on the vantage's queue through a real worker; nothing is stored.
import crypto from 'node:crypto';
import type PgBoss from 'pg-boss';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startDemoTarget, type DemoTarget } from '../../../scripts/demo-target';
import { startHeartbeat } from '../../../worker/heartbeat';
import { startProber } from '../../../worker/probe-job';
import { addPerson, buildTestApp, signIn, type SignedIn, type TestApp } from '../../helpers/app';

let t: TestApp;
let boss: PgBoss;
let target: DemoTarget;
let engineer: SignedIn;
const stops: (() => Promise<unknown>)[] = [];
const key = crypto.randomBytes(32);

beforeAll(async () => {
  t = await buildTestApp({ secretKey: key, withQueue: true });
  boss = t.boss!;
  target = await startDemoTarget({ port: 0 });
  await t.db.knex('vantages').insert([{ name: 'local' }, { name: 'silent' }]);
  await t.db.knex('settings').insert({ key: 'target_policy', value: JSON.stringify({ allowLoopback: true }) });
  stops.push(await startHeartbeat(boss, t.db.knex, { name: 'local', beatSeconds: 2 }));
  stops.push(await startProber(boss, t.db.knex, { vantage: 'local', secretKey: key, concurrency: 1 }));
  engineer = await signIn(t, (await addPerson(t, 'engineer')).email);
  // Wait for the first heartbeat, so the vantage counts as up.
  for (let i = 0; i < 50 && !(await t.db.knex('worker_heartbeats').where({ name: 'local' }).first()); i++) await new Promise((r) => setTimeout(r, 200));
});
afterAll(async () => {
  for (const s of stops) await s();
  await target.close();
  await t.close();
});

const draft = (url: string, vantages = ['local']) => ({
  name: 'Draft search',
  steps: [{ name: 'Search', method: 'GET', url, assertions: [{ kind: 'status', in: [200] }, { kind: 'json', path: '$.count', op: 'gt', value: 0 }] }],
  schedule: { kind: 'interval', everySeconds: 60 },
  vantages,
});

describe('try it now', () => {
  it('runs a draft on the vantage and answers with the full result, storing no run', async () => {
    const res = await engineer.agent
      .post('/api/journeys/try')
      .set('x-csrf-token', engineer.csrf)
      .send({ document: draft(`${target.url}/api/search?q=oolong`), vantage: 'local' });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body.result.verdict).toBe('pass');
    expect(res.body.result.vantage).toBe('local');
    expect(res.body.result.steps[0].assertions.map((a: { passed: boolean }) => a.passed)).toEqual([true, true]);
    expect(await t.db.knex('runs').count({ n: '*' }).first()).toEqual({ n: 0 });
  });

  it('reports a failing draft as fail with expected vs actual', async () => {
    const res = await engineer.agent
      .post('/api/journeys/try')
      .set('x-csrf-token', engineer.csrf)
      .send({ document: draft(`${target.url}/api/search?q=nothing-matches-this`), vantage: 'local' });
    expect(res.body.result.verdict).toBe('fail');
    const failed = res.body.result.steps[0].assertions.find((a: { passed: boolean }) => !a.passed);
    expect(failed).toMatchObject({ kind: 'json', actual: '0' });
  });

  it('answers 503 with Retry-After when the vantage is silent', async () => {
    const res = await engineer.agent
      .post('/api/journeys/try')
      .set('x-csrf-token', engineer.csrf)
      .send({ document: draft(`${target.url}/`, ['silent']), vantage: 'silent' });
    expect(res.status).toBe(503);
    expect(res.headers['retry-after']).toBeDefined();
    expect(res.body.error.message).toMatch(/silent is down/);
  });
});
