// Signal table upkeep with an injected clock: partitions made ahead, a raw day past retention
// rolled up into one-minute rows and dropped whole, queries over that range served from rollups.
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signalsMaintenance } from '../../../server/signals/maintenance-service';
import { buildTestApp, type TestApp } from '../../helpers/app';
import { makeToken } from './otlp-fixtures';

let t: TestApp;
let token: string;
const NOW = Date.UTC(2026, 5, 30, 12, 0, 0);
const OLD_DAY = Date.UTC(2026, 5, 10); // 20 days before NOW

beforeAll(async () => {
  t = await buildTestApp();
  token = await makeToken(t, ['ingest', 'read']);
});
afterAll(() => t.close());

const partitions = async (table: string) =>
  (await t.db.knex.raw(`SELECT c.relname FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid WHERE i.inhparent = ?::regclass ORDER BY 1`, [table])).rows.map(
    (r: { relname: string }) => r.relname,
  );

describe('signals maintenance', () => {
  it('rolls a raw day past retention into one-minute rows, drops it, and keeps answering queries from the rollups', async () => {
    // A counter every 15 s for 3 minutes on the old day, resetting once in the second minute:
    // minute 0: 0, 10, 20, 30; minute 1: 40, 5 (reset), 15, 25; minute 2: 35, 45, 55, 65.
    const values = [0, 10, 20, 30, 40, 5, 15, 25, 35, 45, 55, 65];
    const points = values.map((v, i) => ({ service: 'old', signal: 'hits', kind: 'counter', labels: {}, t: OLD_DAY + i * 15_000, value: v }));
    points.push({ service: 'old', signal: 'hits', kind: 'counter', labels: {}, t: NOW - 3_600_000, value: 1 });
    const hist = { service: 'old', signal: 'lat', kind: 'histogram', labels: {}, t: OLD_DAY, bounds: [1], counts: [1, 1] };
    const res = await request(t.app).post('/api/signals/samples').set('authorization', `Bearer ${token}`).send({ points: [...points, hist] });
    expect(res.body.accepted).toBe(14);

    const m = signalsMaintenance(t.db.knex, { rawDays: 14, rollupDays: 400 }, () => new Date(NOW));
    const report = await m.run();
    expect(report.rolledUpPartitions).toEqual(['samples_p20260610']);
    expect(report.droppedPartitions).toEqual(['histogram_points_p20260610']);
    expect(report.rollupRows).toBe(3);
    expect(await partitions('samples')).toEqual(['samples_p20260630', 'samples_p20260701']);

    const rollups = await t.db.knex('sample_rollups').orderBy('t').select('t', 'last_t', 'last', 'min', 'max', 'sum', 'count');
    expect(rollups.map((r) => [r.t.toISOString(), r.last_t.getTime() - OLD_DAY, r.last, r.min, r.max, r.sum, r.count])).toEqual([
      ['2026-06-10T00:00:00.000Z', 45_000, 30, 0, 30, 60, 4],
      ['2026-06-10T00:01:00.000Z', 105_000, 25, 5, 40, 85, 4],
      ['2026-06-10T00:02:00.000Z', 165_000, 65, 35, 65, 200, 4],
    ]);

    // Running again changes nothing.
    const again = await m.run();
    expect(again.rolledUpPartitions).toEqual([]);
    expect(await t.db.knex('sample_rollups').count({ n: '*' }).first()).toEqual({ n: 3 });

    // Increase over the old range from the minute rows: 30 → 25 is a reset (+25), 25 → 65 (+40).
    const q = await request(t.app)
      .get('/api/signals/query')
      .set('authorization', `Bearer ${token}`)
      .query({ service: 'old', signal: 'hits', fn: 'increase', from: OLD_DAY + 180_000, to: OLD_DAY + 180_000, step: '3m', window: '3m' });
    expect(q.status).toBe(200);
    expect(q.body.groups[0].points).toEqual([{ t: OLD_DAY + 180_000, v: 65 }]);
  });
});
