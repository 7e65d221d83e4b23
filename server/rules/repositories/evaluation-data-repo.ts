// Reading what many rules need in few statements (CONVENTIONS.md rule 13; measured by
// bench/evaluate.ts). The signals' own query-repo answers one query (one signal, one range, with
// rollups for old ranges); an evaluation cycle needs the recent window of thousands of series for
// a thousand rules at once, so it has its own statements here:
// - signals of all rules resolved in one join,
// - series of all (rule, signal, filters) matched in one join,
// - samples loaded per distinct window start, many series per statement, raw partitions only
//   (a window that reaches into rolled-up days is far longer than any rule window).
import type { Knex } from 'knex';
import type { HistogramPoint, Sample } from '../../../shared/metrics';
import type { Labels } from '../../../shared/rules/label-groups';
import type { RuleDocument } from '../../../shared/rules/rule-schema';
import type { SignalKind } from '../../../shared/schemas/signals';

export interface LiveRule {
  id: number;
  version: number;
  serviceId: number;
  service: string;
  document: RuleDocument;
}

export interface ResolvedSignal {
  id: number;
  kind: SignalKind;
  unit: string;
}

export interface SeriesMatcher {
  /** The caller's key for this (rule, signal, filters). */
  key: number;
  signalId: number;
  filters: Record<string, string>;
}

export interface MatchedSeries {
  id: number;
  labels: Labels;
}

/** Series ids per statement: large enough for few round trips, small enough to keep plans simple. */
const CHUNK = 2000;

function chunks<T>(xs: T[], n: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < xs.length; i += n) out.push(xs.slice(i, i + n));
  return out;
}

export const evaluationDataRepo = {
  async enabledRules(db: Knex): Promise<LiveRule[]> {
    const rows = (
      await db.raw(
        `SELECT r.id, r.version, r.service_id, s.name AS service, r.document, r.name, r.enabled
         FROM alert_rules r JOIN services s ON s.id = r.service_id
         WHERE r.enabled AND r.deleted_at IS NULL ORDER BY r.id`,
      )
    ).rows as { id: number; version: number; service_id: number; service: string; document: RuleDocument; name: string; enabled: boolean }[];
    return rows.map((r) => ({ id: r.id, version: r.version, serviceId: r.service_id, service: r.service, document: { ...r.document, name: r.name, enabled: r.enabled } }));
  },

  /** `${serviceId}\u0001${name}` → signal, for every pair asked. */
  async resolveSignals(db: Knex, pairs: Array<{ serviceId: number; name: string }>): Promise<Map<string, ResolvedSignal>> {
    if (pairs.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT g.id, g.service_id, g.name, g.kind, g.unit FROM signals g
         JOIN (SELECT DISTINCT * FROM unnest(?::bigint[], ?::text[])) AS w(service_id, name) ON w.service_id = g.service_id AND w.name = g.name`,
        [pairs.map((p) => p.serviceId), pairs.map((p) => p.name)],
      )
    ).rows as { id: number; service_id: number; name: string; kind: SignalKind; unit: string }[];
    return new Map(rows.map((r) => [`${r.service_id}\u0001${r.name}`, { id: r.id, kind: r.kind, unit: r.unit }]));
  },

  /**
   * Series matching each matcher (labels contain its filters) that reported since `activeSinceMs`:
   * series silent for longer are gone (a replaced instance), not "no data" forever.
   */
  async matchSeries(db: Knex, matchers: SeriesMatcher[], activeSinceMs: number): Promise<Map<number, MatchedSeries[]>> {
    const out = new Map<number, MatchedSeries[]>(matchers.map((m) => [m.key, []]));
    if (matchers.length === 0) return out;
    const rows = (
      await db.raw(
        `SELECT m.k, x.id, x.labels
         FROM unnest(?::int[], ?::bigint[], ?::jsonb[]) AS m(k, signal_id, filters)
         JOIN series x ON x.signal_id = m.signal_id AND x.labels @> m.filters
         WHERE x.last_sample_at >= to_timestamp(? / 1000.0)
         ORDER BY m.k, x.id`,
        [matchers.map((m) => m.key), matchers.map((m) => m.signalId), matchers.map((m) => JSON.stringify(m.filters)), activeSinceMs],
      )
    ).rows as { k: number; id: number; labels: Labels }[];
    for (const r of rows) out.get(r.k)!.push({ id: r.id, labels: r.labels });
    return out;
  },

  /**
   * Samples of each series from its own start to `toMs`, time-ordered. Series sharing a start go
   * in one statement (rules mostly share a handful of windows).
   */
  async samples(db: Knex, wants: Map<number, number>, toMs: number, concurrency = 4): Promise<Map<number, Sample[]>> {
    const out = new Map<number, Sample[]>();
    const tasks = groupedByStart(wants).flatMap(([fromMs, ids]) => chunks(ids, CHUNK).map((part) => ({ fromMs, part })));
    await runLimited(tasks, concurrency, async ({ fromMs, part }) => {
      // series_id = ANY(...) with GROUP BY measured faster here than one LATERAL range scan per
      // series, and than reading plain rows (bench/evaluate.ts; A/B on 10 000 series).
      const rows = (
        await db.raw(
          `SELECT series_id, array_agg((extract(epoch FROM t) * 1000)::float8 ORDER BY t) AS ts, array_agg(value ORDER BY t) AS vs
           FROM samples WHERE series_id = ANY(?::bigint[]) AND t >= to_timestamp(? / 1000.0) AND t <= to_timestamp(? / 1000.0)
           GROUP BY series_id`,
          [part, fromMs, toMs],
        )
      ).rows as { series_id: number; ts: number[]; vs: number[] }[];
      for (const r of rows) {
        const list = new Array<Sample>(r.ts.length);
        for (let i = 0; i < r.ts.length; i++) list[i] = { t: r.ts[i]!, v: r.vs[i]! };
        out.set(r.series_id, list);
      }
    });
    return out;
  },

  async histograms(db: Knex, wants: Map<number, number>, toMs: number, concurrency = 4): Promise<Map<number, HistogramPoint[]>> {
    const out = new Map<number, HistogramPoint[]>();
    const tasks = groupedByStart(wants).flatMap(([fromMs, ids]) => chunks(ids, CHUNK).map((part) => ({ fromMs, part })));
    await runLimited(tasks, concurrency, async ({ fromMs, part }) => {
      const rows = (
        await db.raw(
          `SELECT series_id, (extract(epoch FROM t) * 1000)::float8 AS ms, bounds, counts::float8[] AS counts
           FROM histogram_points WHERE series_id = ANY(?::bigint[]) AND t >= to_timestamp(? / 1000.0) AND t <= to_timestamp(? / 1000.0)
           ORDER BY series_id, t`,
          [part, fromMs, toMs],
        )
      ).rows as { series_id: number; ms: number; bounds: number[]; counts: number[] }[];
      for (const r of rows) {
        let list = out.get(r.series_id);
        if (!list) out.set(r.series_id, (list = []));
        list.push({ t: r.ms, bounds: r.bounds, counts: r.counts });
      }
    });
    return out;
  },

  /**
   * The newest `perSeries` sample times of each series (ms, newest first), to estimate how often
   * they are sampled when a rule is saved; queryRepo has no "last N samples" read.
   */
  async recentTimes(db: Knex, table: 'samples' | 'histogram_points', ids: number[], perSeries: number): Promise<Map<number, number[]>> {
    if (ids.length === 0) return new Map();
    const rows = (
      await db.raw(
        `SELECT u.id, ARRAY(SELECT (extract(epoch FROM x.t) * 1000)::float8 FROM ${table} x WHERE x.series_id = u.id ORDER BY x.t DESC LIMIT ?) AS ts
         FROM unnest(?::bigint[]) AS u(id)`,
        [perSeries, ids],
      )
    ).rows as { id: number; ts: number[] }[];
    return new Map(rows.map((r) => [r.id, r.ts]));
  },
};

function groupedByStart(wants: Map<number, number>): Array<[number, number[]]> {
  const byStart = new Map<number, number[]>();
  for (const [id, from] of wants) {
    const list = byStart.get(from);
    if (list) list.push(id);
    else byStart.set(from, [id]);
  }
  return [...byStart.entries()];
}

async function runLimited<T>(tasks: T[], limit: number, fn: (t: T) => Promise<void>): Promise<void> {
  let next = 0;
  const workers = Array.from({ length: Math.max(1, Math.min(limit, tasks.length)) }, async () => {
    while (next < tasks.length) await fn(tasks[next++]!);
  });
  await Promise.all(workers);
}
