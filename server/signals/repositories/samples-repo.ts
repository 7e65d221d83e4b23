// Writing samples and histogram points: one multi-row statement per table (unnest of arrays), with
// ON CONFLICT DO NOTHING on (series_id, t) so a re-sent point changes nothing.
import type { Knex } from 'knex';

export interface SampleRows {
  seriesIds: number[];
  /** ms since the epoch (fractions keep microseconds). */
  times: number[];
  values: number[];
}

export interface HistogramRows {
  seriesIds: number[];
  times: number[];
  bounds: number[][];
  counts: number[][];
  sums: (number | null)[];
  totals: number[];
}

export interface LastSample {
  seriesId: number;
  t: number;
  value: number;
}

export interface LastHistogram {
  seriesId: number;
  t: number;
  bounds: number[];
  counts: number[];
  sum: number | null;
  count: number;
}

const pgArray = (xs: number[]) => `{${xs.join(',')}}`;

export const samplesRepo = {
  /**
   * Returns how many rows were new. `skipExisting: false` is the fast path for points never seen
   * before (about a third cheaper than ON CONFLICT DO NOTHING); it fails with a unique violation
   * (23505) when any point exists already.
   */
  async insertSamples(db: Knex, rows: SampleRows, opts: { skipExisting: boolean } = { skipExisting: true }): Promise<number> {
    if (rows.seriesIds.length === 0) return 0;
    const r = await db.raw(
      `INSERT INTO samples (series_id, t, value)
       SELECT s, to_timestamp(ms / 1000.0), v FROM unnest(?::bigint[], ?::float8[], ?::float8[]) AS u(s, ms, v)
       ${opts.skipExisting ? 'ON CONFLICT DO NOTHING' : ''}`,
      [rows.seriesIds, rows.times, rows.values],
    );
    return r.rowCount ?? 0;
  },

  async insertHistograms(db: Knex, rows: HistogramRows): Promise<number> {
    if (rows.seriesIds.length === 0) return 0;
    // Arrays of arrays cannot be unnested one level, so each row's arrays travel as array literals.
    const r = await db.raw(
      `INSERT INTO histogram_points (series_id, t, bounds, counts, sum, count)
       SELECT s, to_timestamp(ms / 1000.0), b::float8[], c::bigint[], sm, n
       FROM unnest(?::bigint[], ?::float8[], ?::text[], ?::text[], ?::float8[], ?::bigint[]) AS u(s, ms, b, c, sm, n)
       ON CONFLICT DO NOTHING`,
      [rows.seriesIds, rows.times, rows.bounds.map(pgArray), rows.counts.map(pgArray), rows.sums as number[], rows.totals],
    );
    return r.rowCount ?? 0;
  },

  /** The newest sample of each series (for accumulating delta points). */
  async lastSamples(db: Knex, seriesIds: number[]): Promise<Map<number, LastSample>> {
    if (seriesIds.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT u.id AS series_id, extract(epoch FROM x.t) * 1000 AS ms, x.value
         FROM unnest(?::bigint[]) AS u(id)
         CROSS JOIN LATERAL (SELECT t, value FROM samples WHERE series_id = u.id ORDER BY t DESC LIMIT 1) x`,
        [seriesIds],
      )
    ).rows as { series_id: number; ms: string; value: number }[];
    return new Map(rows.map((r) => [r.series_id, { seriesId: r.series_id, t: Number(r.ms), value: r.value }]));
  },

  async lastHistograms(db: Knex, seriesIds: number[]): Promise<Map<number, LastHistogram>> {
    if (seriesIds.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT u.id AS series_id, extract(epoch FROM x.t) * 1000 AS ms, x.bounds, x.counts, x.sum, x.count
         FROM unnest(?::bigint[]) AS u(id)
         CROSS JOIN LATERAL (SELECT * FROM histogram_points WHERE series_id = u.id ORDER BY t DESC LIMIT 1) x`,
        [seriesIds],
      )
    ).rows as { series_id: number; ms: string; bounds: number[]; counts: (string | number)[]; sum: number | null; count: number }[];
    return new Map(
      rows.map((r) => [
        r.series_id,
        { seriesId: r.series_id, t: Number(r.ms), bounds: r.bounds, counts: r.counts.map(Number), sum: r.sum, count: Number(r.count) },
      ]),
    );
  },

  /** Which (series, t) pairs are already stored, as `${seriesId}:${ms}` keys. */
  async existingTimes(db: Knex, table: 'samples' | 'histogram_points', seriesIds: number[], times: number[]): Promise<Set<string>> {
    if (seriesIds.length === 0) return new Set();
    const rows = (
      await db.raw(
        `SELECT u.s AS series_id, u.ms FROM unnest(?::bigint[], ?::float8[]) AS u(s, ms)
         WHERE EXISTS (SELECT 1 FROM ${table} x WHERE x.series_id = u.s AND x.t = to_timestamp(u.ms / 1000.0))`,
        [seriesIds, times],
      )
    ).rows as { series_id: number; ms: number }[];
    return new Set(rows.map((r) => `${r.series_id}:${r.ms}`));
  },
};
