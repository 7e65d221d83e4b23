// What a run leaves behind: secrets never stored or answered in clear, captures masked, and old
// runs removed by dropping whole daily partitions.
import crypto from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { JourneyDocumentInput } from '../../shared/journey/journey-schema';
import { runsRepo } from '../../server/repositories/runs';
import { secretsService } from '../../server/services/secrets';
import { applyRunRetention } from '../../worker/retention';
import { runJourney } from '../../worker/prober';
import { addPerson, buildTestApp, signIn, type TestApp } from '../helpers/app';

let t: TestApp;
let echo: http.Server;
let echoUrl: string;
const SECRET = 'teapot-credential-5d1e0b77c2';
const key = crypto.randomBytes(32);

beforeAll(async () => {
  t = await buildTestApp({ secretKey: key });
  // A target that echoes the request's Authorization header back in a failing response.
  echo = http.createServer((req, res) => {
    res.writeHead(req.url === '/login' ? 200 : 500, { 'content-type': 'application/json' });
    res.end(JSON.stringify({ sessionToken: 'sess-abc123', youSent: req.headers.authorization ?? null }));
  });
  await new Promise<void>((r) => echo.listen(0, '127.0.0.1', () => r()));
  echoUrl = `http://127.0.0.1:${(echo.address() as AddressInfo).port}`;
});
afterAll(async () => {
  echo.close();
  await t.close();
});

describe('stored runs', () => {
  it('keeps secrets out of excerpts, the database and API answers, and masks captures', async () => {
    const actor = { type: 'token' as const, id: 0, name: 'test', scopes: [] };
    await secretsService(t.db.knex, key).save(actor, 'TEAPOT_KEY', SECRET);
    await t.db.knex('vantages').insert({ name: 'local' });
    const doc: JourneyDocumentInput = {
      name: 'Echo',
      steps: [
        { name: 'login', method: 'GET', url: `${echoUrl}/login`, captures: [{ from: 'json', name: 'session', path: '$.sessionToken' }] },
        { name: 'order', method: 'GET', url: `${echoUrl}/order`, headers: [{ name: 'Authorization', value: 'Bearer {{secret.TEAPOT_KEY}}' }] },
      ],
      schedule: { kind: 'interval', everySeconds: 60 },
      vantages: ['local'],
    };
    const lines: string[] = [];
    const orig = { log: console.log, error: console.error, warn: console.warn };
    for (const k of ['log', 'error', 'warn'] as const) console[k] = (...a: unknown[]) => lines.push(a.map(String).join(' '));
    let result;
    try {
      result = await runJourney(doc, { vantage: 'local', secrets: { TEAPOT_KEY: SECRET }, targetPolicy: { allowLoopback: true } });
    } finally {
      Object.assign(console, orig);
    }
    expect(result.verdict).toBe('fail');
    expect(result.failedStep).toBe(1);
    expect(result.steps[1]!.responseExcerpt).toContain('[secret:TEAPOT_KEY]');
    const runId = await runsRepo.insertOnce(t.db.knex, { journeyId: 1, version: 1, vantage: 'local', slotAt: new Date() }, result, 0);

    const tables = await t.db.knex.raw("SELECT tablename FROM pg_tables WHERE schemaname = 'public'");
    for (const { tablename } of tables.rows as { tablename: string }[]) {
      const r = await t.db.knex.raw(`SELECT coalesce(string_agg(x::text, '|'), '') AS s FROM ?? x`, [tablename]);
      expect(r.rows[0].s, tablename).not.toContain(SECRET);
      expect(r.rows[0].s, tablename).not.toContain('sess-abc123');
    }
    const viewer = await signIn(t, (await addPerson(t, 'reviewer')).email);
    const res = await viewer.agent.get(`/api/runs/${runId}`).expect(200);
    expect(JSON.stringify(res.body)).not.toContain(SECRET);
    expect(res.body.steps[0].captures).toEqual({ session: '•••• (11 characters)' });
    expect(res.body.steps[1].responseExcerpt).toContain('[captured:session]');
    expect(res.body.steps[1].responseExcerpt).toContain('[secret:TEAPOT_KEY]');
    expect(lines.join('\n')).not.toContain(SECRET);
  });

  it('drops whole daily partitions older than the retention setting', async () => {
    const now = new Date('2026-12-01T12:00:00Z');
    const day = (n: number) => new Date(now.getTime() - n * 86_400_000);
    await t.db.knex('settings').insert({ key: 'run_retention_days', value: '7' }).onConflict('key').merge();
    for (const n of [20, 8, 6, 0]) {
      await runsRepo.insertOnce(
        t.db.knex,
        { journeyId: 9, version: 1, vantage: 'local', slotAt: day(n) },
        { verdict: 'pass', vantage: 'local', startedAt: day(n).toISOString(), finishedAt: day(n).toISOString(), durationMs: 5, failureClass: null, failedStep: null, voidReason: null, steps: [] },
        0,
      );
    }
    const dropped = await applyRunRetention(t.db.knex, now);
    expect(dropped.sort()).toEqual(['runs_20261111', 'runs_20261123', 'step_results_20261111', 'step_results_20261123']);
    const left = (await t.db.knex('runs').where({ journey_id: 9 }).select('slot_at')).map((r) => r.slot_at.toISOString().slice(0, 10)).sort();
    expect(left).toEqual(['2026-11-25', '2026-12-01']);
  });
});
