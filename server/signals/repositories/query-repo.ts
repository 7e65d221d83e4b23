// Reading series and their samples for the query API. Samples travel as two arrays per series
// (times, values) so a day of a thousand series is a thousand rows, not a million.
import type { Knex } from 'knex';
import type { HistogramPoint } from '../../../shared/metrics';
import type { Sample } from '../../../shared/metrics';

export interface MatchedSeries {
  id: number;
  labels: Record<string, string>;
}

export const queryRepo = {
  /** Series of a signal whose labels contain all the filters; at most `limit` + 1 (to detect overflow). */
  async matchSeries(db: Knex, signalId: number, filters: Record<string, string>, limit: number): Promise<MatchedSeries[]> {
    const rows = await db('series')
      .where('signal_id', signalId)
      .whereRaw('labels @> ?::jsonb', [JSON.stringify(filters)])
      .orderBy('id')
      .limit(limit + 1)
      .select('id', 'labels');
    return rows.map((r) => ({ id: r.id, labels: r.labels }));
  },

  /**
   * Samples in [from, to] (ms), time-ordered per series. Where raw partitions were already dropped
   * (before `rawStartMs`), the last sample of each minute comes from the rollups instead.
   */
  async samples(db: Knex, ids: number[], fromMs: number, toMs: number, rawStartMs: number): Promise<Map<number, Sample[]>> {
    if (ids.length === 0) return new Map();
    // Comma-joined text splits natively in JS, several times faster than parsing array literals.
    const rows = (
      await db.raw(
        `SELECT series_id, string_agg(ms::text, ',' ORDER BY ms) AS ts, string_agg(v::text, ',' ORDER BY ms) AS vs FROM (
           SELECT series_id, (extract(epoch FROM last_t) * 1000)::float8 AS ms, last AS v FROM sample_rollups
           WHERE series_id = ANY(?::bigint[]) AND last_t >= to_timestamp(? / 1000.0) AND last_t <= to_timestamp(? / 1000.0)
             AND last_t < to_timestamp(? / 1000.0)
           UNION ALL
           SELECT series_id, (extract(epoch FROM t) * 1000)::float8, value FROM samples
           WHERE series_id = ANY(?::bigint[]) AND t >= to_timestamp(? / 1000.0) AND t <= to_timestamp(? / 1000.0)
         ) u GROUP BY series_id`,
        [ids, fromMs, toMs, rawStartMs, ids, fromMs, toMs],
      )
    ).rows as { series_id: number; ts: string; vs: string }[];
    const out = new Map<number, Sample[]>();
    for (const r of rows) {
      const ts = r.ts.split(',');
      const vs = r.vs.split(',');
      const list = new Array<Sample>(ts.length);
      for (let i = 0; i < ts.length; i++) list[i] = { t: Number(ts[i]), v: Number(vs[i]) };
      out.set(r.series_id, list);
    }
    return out;
  },

  async histograms(db: Knex, ids: number[], fromMs: number, toMs: number): Promise<Map<number, HistogramPoint[]>> {
    if (ids.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT series_id, (extract(epoch FROM t) * 1000)::float8 AS ms, bounds, counts::float8[] AS counts FROM histogram_points
         WHERE series_id = ANY(?::bigint[]) AND t >= to_timestamp(? / 1000.0) AND t <= to_timestamp(? / 1000.0)
         ORDER BY series_id, t`,
        [ids, fromMs, toMs],
      )
    ).rows as { series_id: number; ms: number; bounds: number[]; counts: number[] }[];
    const out = new Map<number, HistogramPoint[]>();
    for (const r of rows) {
      const list = out.get(r.series_id) ?? [];
      list.push({ t: r.ms, bounds: r.bounds, counts: r.counts });
      out.set(r.series_id, list);
    }
    return out;
  },

  async countSamples(db: Knex, ids: number[], fromMs: number, toMs: number, table: 'samples' | 'histogram_points'): Promise<number> {
    if (ids.length === 0) return 0;
    const r = await db.raw(
      `SELECT count(*) AS n FROM ${table} WHERE series_id = ANY(?::bigint[]) AND t >= to_timestamp(? / 1000.0) AND t <= to_timestamp(? / 1000.0)`,
      [ids, fromMs, toMs],
    );
    return Number(r.rows[0].n);
  },
};
