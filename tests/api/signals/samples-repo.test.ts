// Samples written with binary COPY (samples-repo.ts) against the same rows written the way SQL
// writes them (to_timestamp of milliseconds, as the other paths and the earlier INSERT did): the
// stored instants must be identical, or a re-sent point would be stored twice.
import type { Knex } from 'knex';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { encodeSampleCopy, samplesRepo } from '../../../server/signals/repositories/samples-repo';
import { createTestDb, type TestDb } from '../../helpers/db';

let db: TestDb;
const DAY = Date.UTC(2026, 2, 3);

beforeAll(async () => {
  db = await createTestDb();
  await db.knex.raw("SELECT signals_ensure_day_partition('samples', ?::date)", ['2026-03-03']);
});
afterAll(() => db.drop());

// Milliseconds as the OTLP normaliser makes them (whole microseconds), then ones between
// microseconds (CSV or the JSON batch may send any fraction), which to_timestamp's own float8
// arithmetic rounds in its own way (5000.0004 ms comes out as 5.000001 s).
const TIMES = [DAY, DAY + 0.001, DAY + 123.456, DAY + 999.999, DAY + 86_399_999.999, DAY + 5000.0004, DAY + 6000.0005, DAY + 7000.0015, DAY + 8000.49999];

const stored = async (knex: Knex, seriesId: number) =>
  (await knex.raw(`SELECT to_char(t AT TIME ZONE 'UTC', 'YYYY-MM-DD HH24:MI:SS.US') AS t, value FROM samples WHERE series_id = ? ORDER BY t`, [seriesId])).rows;

describe('samples by binary COPY', () => {
  it('stores the same instants and values as to_timestamp(ms / 1000.0)', async () => {
    const values = TIMES.map((_, i) => i * 1.5 - 2);
    await db.knex.transaction((tx) => samplesRepo.copySamples(tx, { seriesIds: TIMES.map(() => 1), times: TIMES, values }));
    await db.knex.raw(
      'INSERT INTO samples (series_id, t, value) SELECT 2, to_timestamp(ms / 1000.0), v FROM unnest(?::float8[], ?::float8[]) AS u(ms, v)',
      [TIMES, values],
    );
    const viaCopy = await stored(db.knex, 1);
    expect(viaCopy).toEqual(await stored(db.knex, 2));
    // The whole-microsecond ones, exactly (values −2, −0.5, 1, 2.5 and 4 mark them).
    expect(viaCopy.filter((r: { value: number }) => values.slice(0, 5).includes(r.value)).map((r: { t: string }) => r.t)).toEqual([
      '2026-03-03 00:00:00.000000',
      '2026-03-03 00:00:00.000001',
      '2026-03-03 00:00:00.123456',
      '2026-03-03 00:00:00.999999',
      '2026-03-03 23:59:59.999999',
    ]);
  });

  it('fails the plain COPY on a stored point, skips it through staging, and picks the way by itself', async () => {
    // Series 2's rows were written by SQL above: the same instants from COPY are the same rows.
    const rows = { seriesIds: [2, 2], times: [DAY + 123.456, DAY + 777], values: [9, 9] };
    await expect(db.knex.transaction((tx) => samplesRepo.copySamples(tx, rows))).rejects.toMatchObject({ code: '23505' });
    expect(await db.knex.transaction((tx) => samplesRepo.insertSamplesSkippingExisting(tx, rows))).toBe(1);
    // Twice in one transaction: the staging table is reused, not created again.
    const again = await db.knex.transaction(async (tx) => [
      await samplesRepo.insertSamplesSkippingExisting(tx, rows),
      await samplesRepo.insertSamplesSkippingExisting(tx, { ...rows, times: [DAY + 778, DAY + 779] }),
    ]);
    expect(again).toEqual([0, 2]);
    // insertSamples: new rows by COPY; a batch holding stored rows falls back, in the same
    // transaction, and the work before it in that transaction survives the fallback.
    const mixed = await db.knex.transaction(async (tx) => {
      await tx.raw('INSERT INTO samples (series_id, t, value) VALUES (3, to_timestamp(? / 1000.0), 1)', [DAY + 1]);
      return [
        await samplesRepo.insertSamples(tx, { seriesIds: [2], times: [DAY + 780], values: [9] }),
        await samplesRepo.insertSamples(tx, { seriesIds: [2, 2], times: [DAY + 780, DAY + 781], values: [9, 9] }),
      ];
    });
    expect(mixed).toEqual([1, 1]);
    expect((await stored(db.knex, 2)).filter((r: { value: number }) => r.value === 9)).toHaveLength(5);
    expect(await stored(db.knex, 3)).toHaveLength(1);
  });

  it('writes the COPY binary header, one 38-byte row per sample and the trailer', () => {
    const buf = encodeSampleCopy({ seriesIds: [2 ** 40 + 7], times: [Date.UTC(2000, 0, 1) + 0.001], values: [0.5] });
    // PostgreSQL documentation, COPY, "Binary Format": signature, flags, header extension length.
    expect(buf.subarray(0, 11)).toEqual(Buffer.from('PGCOPY\n\xff\r\n\0', 'latin1'));
    expect(buf.readInt32BE(11)).toBe(0);
    expect(buf.readInt32BE(15)).toBe(0);
    expect(buf.readInt16BE(19)).toBe(3);
    expect([buf.readInt32BE(21), buf.readBigInt64BE(25)]).toEqual([8, 2n ** 40n + 7n]);
    // timestamptz: microseconds since 2000-01-01 00:00 UTC.
    expect([buf.readInt32BE(33), buf.readBigInt64BE(37)]).toEqual([8, 1n]);
    expect([buf.readInt32BE(45), buf.readDoubleBE(49)]).toEqual([8, 0.5]);
    expect(buf.readInt16BE(57)).toBe(-1);
    expect(buf.length).toBe(59);
  });
});
