// Evaluation benchmark (issue 5), run with `npx tsx bench/evaluate.ts`: one evaluation cycle of
// 1 000 rules (all eight kinds) over 10 000 series holding 1 h of 15 s samples, against the time
// PostgreSQL alone takes to read the same samples (the same series from the same instants, in the
// same statements' chunks and concurrency), measured in the same run on a throwaway private
// cluster (bench/lib/private-db.ts, port 54371). Numbers are printed, never asserted.
import pg from 'pg';
import type PgBoss from 'pg-boss';
import { ruleDocumentSchema, type RuleDocument } from '../shared/rules/rule-schema';
import { startBoss } from '../worker/boss';
import { runEvaluationCycle, planReads, type CycleSummary } from '../worker/evaluator/cycle';
import { ensureNotifyQueues } from '../worker/notifier/queues';
import { percentile, startPrivateDb, type PrivateDb } from './lib/private-db';

const PORT = Number(process.env.PARALLAX_BENCH_DB_PORT ?? 54371);
const SERVICES = 10;
const RULES_PER_SERVICE = 100;
/** Series per signal of each service: 250 + 250 + 250 + 150 + 100 = 1 000 per service. */
const SIGNALS = [
  { name: 'requests', kind: 'counter', series: 250 },
  { name: 'errors', kind: 'counter', series: 250 },
  { name: 'cpu', kind: 'gauge', series: 250 },
  { name: 'disk_free', kind: 'gauge', series: 150 },
  { name: 'latency', kind: 'histogram', series: 100 },
] as const;
const ZONES = 5;
const STEP_MS = 15_000;
const SAMPLES = 241; // 1 h of 15 s samples, both ends included
export const AT = Date.UTC(2026, 10, 2, 12, 0, 0);
const FROM = AT - (SAMPLES - 1) * STEP_MS;
const RUNS = Number(process.env.BENCH_RUNS ?? 5);
const STALE_MS = 3_600_000;

const ms = (x: number) => `${x.toFixed(1)} ms`;
const median = (xs: number[]) => percentile([...xs].sort((a, b) => a - b), 0.5);

export async function seed(db: PrivateDb): Promise<void> {
  const k = db.knex;
  const day = new Date(AT).toISOString().slice(0, 10);
  for (const table of ['samples', 'histogram_points']) await k.raw('SELECT signals_ensure_day_partition(?, ?::date)', [table, day]);
  await k.raw(`INSERT INTO services (name) SELECT 'svc-' || g FROM generate_series(0, ${SERVICES - 1}) g`);
  await k.raw(
    `INSERT INTO signals (service_id, name, kind, unit) SELECT s.id, x.name, x.kind, '1' FROM services s
     CROSS JOIN (VALUES ${SIGNALS.map((g) => `('${g.name}', '${g.kind}')`).join(', ')}) AS x(name, kind)`,
  );
  await k.raw(
    `INSERT INTO series (signal_id, labels, labels_hash, last_sample_at)
     SELECT g.id, jsonb_build_object('instance', 'i' || i, 'zone', 'z' || (i % ${ZONES})), md5(g.id || ':' || i), to_timestamp(? / 1000.0)
     FROM signals g JOIN generate_series(0, 249) i
       ON i < CASE g.name ${SIGNALS.map((s) => `WHEN '${s.name}' THEN ${s.series}`).join(' ')} END`,
    [AT],
  );
  // Counters grow at 10–22/s (a few restart half-way), errors at 0.1/s or, for one zone in seven
  // services, 3/s; cpu waves around 0.5 with a few hot instances; some disks fill.
  await k.raw(
    `INSERT INTO samples (series_id, t, value)
     SELECT x.id, to_timestamp((?::float8 + n * ${STEP_MS}) / 1000.0),
       CASE g.name
         WHEN 'requests' THEN CASE WHEN x.id % 50 = 0 AND n >= 120 THEN (n - 120) ELSE n END * 15 * (10 + x.id % 13)
         WHEN 'errors' THEN n * 15 * CASE WHEN (x.labels->>'zone') = 'z1' AND g.service_id % 10 < 7 THEN 3 ELSE 0.1 END
         WHEN 'cpu' THEN 0.5 + 0.2 * sin(n / 10.0 + x.id) + CASE WHEN x.id % 97 = 0 THEN 0.45 ELSE 0 END
         ELSE 5e10 - n * CASE WHEN x.id % 9 = 0 THEN 4e7 ELSE 1e5 END
       END
     FROM series x JOIN signals g ON g.id = x.signal_id AND g.kind <> 'histogram'
     CROSS JOIN generate_series(0, ${SAMPLES - 1}) n`,
    [FROM],
  );
  await k.raw(
    `INSERT INTO histogram_points (series_id, t, bounds, counts, sum, count)
     SELECT x.id, to_timestamp((?::float8 + n * ${STEP_MS}) / 1000.0), '{0.005,0.01,0.025,0.05,0.1,0.25,0.5,1,2.5,5}'::float8[],
       ARRAY[n * 30, n * 100, n * 200, n * 150, n * 80, n * 40, n * 20, n * (x.id % 4) * 5, n * 2, 0, 0]::bigint[], NULL,
       n * (622 + (x.id % 4) * 5)
     FROM series x JOIN signals g ON g.id = x.signal_id AND g.kind = 'histogram'
     CROSS JOIN generate_series(0, ${SAMPLES - 1}) n`,
    [FROM],
  );
  await k.raw('ANALYZE');
}

/** 100 rules per service, the eight kinds mixed, each reading one zone (50, 30 or 20 series). */
function rulesFor(service: string, i: number): RuleDocument {
  const zone = `z${i % ZONES}`;
  const common = {
    name: `${service} rule ${i}`,
    service,
    filters: { zone },
    window: i % 4 === 0 ? '15m' : '5m',
    sustain: i % 10 === 0 ? 0 : '2m',
    clear: '2m',
    severity: i % 3 === 0 ? 'page' : 'ticket',
    responderNote: 'Check the service dashboard first.',
    recipients: i % 5 === 0 ? ['oncall@example.test'] : [],
  };
  const kinds = [
    { kind: 'threshold', signal: 'cpu', groupBy: ['instance'], op: '>', threshold: 0.9 },
    { kind: 'counter_rate', signal: 'requests', groupBy: ['zone'], op: '<', threshold: 100 },
    { kind: 'error_ratio', signal: 'errors', requestsSignal: 'requests', requestsFilters: { zone }, groupBy: ['instance'], op: '>', threshold: 0.05 },
    { kind: 'latency_quantile', signal: 'latency', quantile: 0.99, groupBy: ['zone'], op: '>', threshold: 0.4 },
    { kind: 'latency_share', signal: 'latency', bound: 0.25, groupBy: ['instance'], op: '>', threshold: 0.1 },
    { kind: 'time_to_limit', signal: 'disk_free', limit: 0, direction: 'below', horizon: '4h', groupBy: ['instance'], window: '30m' },
    { kind: 'outlier', signal: 'cpu', memberLabel: 'instance', groupBy: ['zone'] },
    { kind: 'rate_of_change', signal: 'requests', groupBy: ['zone'], op: '>', threshold: 0.5 },
  ];
  return ruleDocumentSchema.parse({ ...common, ...kinds[i % kinds.length] });
}

export async function insertRules(db: PrivateDb): Promise<void> {
  const services = (await db.knex('services').select('id', 'name')) as { id: number; name: string }[];
  const rows = services.flatMap((s) =>
    Array.from({ length: RULES_PER_SERVICE }, (_, i) => {
      const doc = rulesFor(s.name, i);
      return { name: doc.name, kind: doc.kind, service_id: s.id, document: JSON.stringify(doc), enabled: true };
    }),
  );
  await db.knex.batchInsert('alert_rules', rows, 500);
}

/** The same samples the cycle reads, the same chunks and concurrency, as plain rows (or counted in the server only). */
async function rawRead(pool: pg.Pool, wants: Map<number, number>, table: 'samples' | 'histogram_points', serverOnly: boolean): Promise<number> {
  const byStart = new Map<number, number[]>();
  for (const [id, from] of wants) byStart.set(from, [...(byStart.get(from) ?? []), id]);
  const tasks: Array<{ from: number; ids: number[] }> = [];
  for (const [from, ids] of byStart) for (let i = 0; i < ids.length; i += 2000) tasks.push({ from, ids: ids.slice(i, i + 2000) });
  const cols = table === 'samples' ? 'series_id, t, value' : 'series_id, t, bounds, counts';
  const select = serverOnly ? 'count(*)::int AS n' : cols;
  let rows = 0;
  let next = 0;
  await Promise.all(
    Array.from({ length: 4 }, async () => {
      while (next < tasks.length) {
        const t = tasks[next++]!;
        // Rows arrive as text, unparsed: the baseline is PostgreSQL reading and sending them.
        const r = await pool.query({
          text: `SELECT ${select} FROM ${table} WHERE series_id = ANY($1::bigint[]) AND t >= to_timestamp($2 / 1000.0) AND t <= to_timestamp($3 / 1000.0)`,
          values: [t.ids, t.from, AT],
          types: { getTypeParser: () => (v: string) => v },
        } as pg.QueryConfig);
        rows += serverOnly ? Number(r.rows[0].n) : r.rowCount!;
      }
    }),
  );
  return rows;
}

async function main() {
  console.log(`[bench] starting a private PostgreSQL on 127.0.0.1:${PORT}`);
  const db = await startPrivateDb(PORT);
  let boss: PgBoss | null = null;
  const pool = new pg.Pool({ ...db.settings, max: 4 });
  try {
    let t = performance.now();
    await seed(db);
    await insertRules(db);
    const counts = await db.knex.raw(
      `SELECT (SELECT count(*) FROM series)::int AS series, (SELECT count(*) FROM samples)::int AS samples,
              (SELECT count(*) FROM histogram_points)::int AS hist, (SELECT count(*) FROM alert_rules)::int AS rules`,
    );
    const c = counts.rows[0];
    console.log(`[bench] seeded ${c.rules} rules, ${c.series} series, ${c.samples} samples + ${c.hist} histogram points in ${ms(performance.now() - t)}`);
    boss = await startBoss(db.settings);
    await ensureNotifyQueues(boss);

    let statements = 0;
    db.knex.on('query', () => statements++);
    const cycle = async (at: number): Promise<CycleSummary> => runEvaluationCycle(db.knex, boss!, at, { staleAfterMs: STALE_MS, log: () => {} });

    statements = 0;
    const first = await cycle(AT);
    const firstStatements = statements;
    console.log(
      `[bench] first cycle (opens alerts): ${ms(first.ms.total)} — load ${ms(first.ms.load)}, evaluate ${ms(first.ms.evaluate)}, write ${ms(first.ms.write)}; ` +
        `${first.rules} rules, ${first.series} series, ${first.samples} samples/points read, ${first.groups} groups, ${first.opened} alerts opened, ` +
        `${first.transitions} transitions, ${first.notifications} notifications queued, ${firstStatements} SQL statements`,
    );
    if (first.errors.length) console.log(`[bench] rule errors: ${first.errors.slice(0, 3).join('; ')}`);

    const plan = await planReads(db.knex, AT, STALE_MS);
    if (process.env.BENCH_EXPLAIN) {
      // BENCH_EXPLAIN=1 prints the plan of one chunk of the cycle's sample read and of the raw read.
      const [from, ids] = [...plan.sampleWants.entries()].reduce((m, [id, f]) => m.set(f, [...(m.get(f) ?? []), id]), new Map<number, number[]>()).entries().next().value!;
      for (const sql of [
        `SELECT series_id, array_agg((extract(epoch FROM t) * 1000)::float8 ORDER BY t) AS ts, array_agg(value ORDER BY t) AS vs FROM samples WHERE series_id = ANY($1::bigint[]) AND t >= to_timestamp($2 / 1000.0) AND t <= to_timestamp($3 / 1000.0) GROUP BY series_id`,
        `SELECT series_id, t, value FROM samples WHERE series_id = ANY($1::bigint[]) AND t >= to_timestamp($2 / 1000.0) AND t <= to_timestamp($3 / 1000.0)`,
      ]) {
        const r = await pool.query(`EXPLAIN (ANALYZE, BUFFERS) ${sql}`, [ids.slice(0, 2000), from, AT]);
        console.log(r.rows.map((x: Record<string, string>) => x['QUERY PLAN']).join('\n'));
      }
    }
    const cycles: CycleSummary[] = [];
    const raw: number[] = [];
    const server: number[] = [];
    let rawRows = 0;
    let steadyStatements = 0;
    for (let i = 0; i < RUNS; i++) {
      statements = 0;
      // Steady state: the same instant again (no new samples), so reads are identical to the baseline's.
      cycles.push(await cycle(AT));
      steadyStatements = statements;
      t = performance.now();
      rawRows = (await rawRead(pool, plan.sampleWants, 'samples', false)) + (await rawRead(pool, plan.histogramWants, 'histogram_points', false));
      raw.push(performance.now() - t);
      t = performance.now();
      await rawRead(pool, plan.sampleWants, 'samples', true);
      await rawRead(pool, plan.histogramWants, 'histogram_points', true);
      server.push(performance.now() - t);
    }
    const total = median(cycles.map((x) => x.ms.total));
    const rawMs = median(raw);
    const serverMs = median(server);
    console.log(
      `[bench] steady cycle (median of ${RUNS}): ${ms(total)} — load ${ms(median(cycles.map((x) => x.ms.load)))}, ` +
        `evaluate ${ms(median(cycles.map((x) => x.ms.evaluate)))}, write ${ms(median(cycles.map((x) => x.ms.write)))}; ${steadyStatements} SQL statements`,
    );
    console.log(`[bench] PostgreSQL alone reading the same ${rawRows} rows: ${ms(rawMs)} to the client, ${ms(serverMs)} counted in the server`);
    console.log(`[bench] ratio cycle / raw read: ${(total / rawMs).toFixed(2)} (cycle / server-side scan: ${(total / serverMs).toFixed(2)})`);
    console.log(`[bench] cycle interval 15 000 ms: the cycle uses ${((100 * total) / 15_000).toFixed(1)} % of it`);
  } finally {
    await pool.end().catch(() => {});
    if (boss) await boss.stop({ graceful: false, wait: true }).catch(() => {});
    await db.close();
  }
}

if (require.main === module) {
  main().catch((e) => {
    console.error('[bench] failed:', e);
    process.exit(1);
  });
}
