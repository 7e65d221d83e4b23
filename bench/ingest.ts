// Ingest benchmark (issue 4), run with `npx tsx bench/ingest.ts`:
//  1. OTLP/JSON batches of 10 000 points sent over HTTP to the real server, against a raw COPY of
//     the same rows into a table of the same shape through psql, in the same run, on a throwaway
//     cluster: points/s for both and their ratio (target ≥ 0.5).
//  2. Latency of a 24 h rate query over 1 000 series (one sample a minute, the SDK's default
//     export interval).
// It starts its own PostgreSQL (scripts/db.sh, temporary data directory, its own port) and
// removes it afterwards. Numbers are printed, never asserted. Beside the rates it prints the CPU
// time each side used per batch (this process, which holds both client and server, and the
// PostgreSQL processes, from /proc) and the load average: on a shared machine wall-clock rates
// move with other people's work, CPU time far less.
import { execFileSync } from 'node:child_process';
import crypto from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { createApp } from '../server/app';
import { createKnex } from '../server/db/knex';
import { usersRepo } from '../server/repositories/users';
import { tokensService } from '../server/services/tokens';
import { childrenCpuMs, freePort, privateCluster } from './lib/private-cluster';

const SERIES = 1000;
const POINTS_PER_SERIES = 10; // 1 000 series × 10 instants = 10 000 points per batch
const BATCHES = Number(process.env.BENCH_BATCHES ?? 20);
const CONCURRENCY = Number(process.env.BENCH_CONCURRENCY ?? 2);
const QUERY_RUNS = 5;

function findPsql(): string {
  const candidates: string[] = [];
  if (process.env.PG_BINDIR) candidates.push(path.join(process.env.PG_BINDIR, 'psql'));
  try {
    candidates.push(path.join(execFileSync('pg_config', ['--bindir'], { encoding: 'utf8' }).trim(), 'psql'));
  } catch {
    // no pg_config
  }
  const lib = '/usr/lib/postgresql';
  if (fs.existsSync(lib)) {
    for (const v of fs.readdirSync(lib).sort((a, b) => Number(b) - Number(a))) candidates.push(path.join(lib, v, 'bin', 'psql'));
  }
  candidates.push('psql');
  return candidates.find((c) => c === 'psql' || fs.existsSync(c))!;
}

const nanos = (ms: number) => `${BigInt(ms) * 1_000_000n}`;

/** One OTLP/JSON export: SERIES series × POINTS_PER_SERIES instants of a cumulative counter. */
function otlpBatch(service: string, signal: string, times: number[], value: (series: number, k: number) => number): string {
  const dataPoints: unknown[] = [];
  for (let s = 0; s < SERIES; s++) {
    const attributes = [
      { key: 'instance', value: { stringValue: `i-${s}` } },
      { key: 'zone', value: { stringValue: `z${s % 10}` } },
    ];
    times.forEach((t, k) => dataPoints.push({ attributes, startTimeUnixNano: nanos(times[0]! - 60_000), timeUnixNano: nanos(t), asInt: String(value(s, k)) }));
  }
  return JSON.stringify({
    resourceMetrics: [
      {
        resource: { attributes: [{ key: 'service.name', value: { stringValue: service } }] },
        scopeMetrics: [{ scope: { name: 'bench' }, metrics: [{ name: signal, unit: '1', sum: { aggregationTemporality: 2, isMonotonic: true, dataPoints } }] }],
      },
    ],
  });
}

// A plain node:http client with kept-alive connections: fetch copies every request body once
// more, which in this shared process would be charged to the intake.
const agent = new http.Agent({ keepAlive: true });

function post(url: string, token: string, body: string | Buffer): Promise<void> {
  const bytes = typeof body === 'string' ? Buffer.from(body, 'utf8') : body;
  return new Promise((resolve, reject) => {
    const req = http.request(url, {
      method: 'POST',
      agent,
      headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json', 'content-length': bytes.length },
    });
    req.on('error', reject);
    req.on('response', (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('error', reject);
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        if (res.statusCode !== 200 || text !== '{}') reject(new Error(`intake answered ${res.statusCode}: ${text.slice(0, 300)}`));
        else resolve();
      });
    });
    req.end(bytes);
  });
}

const diff = (after: number | null, before: number | null) => (after === null || before === null ? null : after - before);

async function main() {
  const PORT = Number(process.env.PARALLAX_BENCH_DB_PORT ?? (await freePort()));
  const cluster = privateCluster({ port: PORT, label: 'bench' });
  let server: http.Server | null = null;
  let db: ReturnType<typeof createKnex> | null = null;
  let pool: pg.Pool | null = null;
  const tmp = fs.mkdtempSync(path.join(os.tmpdir(), 'parallax-bench-copy-'));
  try {
    console.log(`[bench] starting a private PostgreSQL on 127.0.0.1:${PORT}`);
    cluster.start();
    const settings = await cluster.createMigratedDatabase('bench');
    db = createKnex(settings, { max: 10 });
    pool = new pg.Pool({ ...settings, max: 2 });
    const app = createApp({ db, sessionPool: pool, sessionSecret: crypto.randomBytes(32).toString('hex'), secretKey: crypto.randomBytes(32), log: () => {} });
    server = http.createServer(app);
    await new Promise<void>((r) => server!.listen(0, '127.0.0.1', () => r()));
    const base = `http://127.0.0.1:${(server.address() as { port: number }).port}`;
    const admin = await usersRepo.insert(db, { email: 'bench@example.test', name: 'Bench', role: 'admin', passwordHash: 'unused' });
    const actor = { type: 'user' as const, id: admin.id, email: admin.email, name: admin.name, role: 'admin' as const };
    const token = (await tokensService(db).create(actor, { name: 'bench', scopes: ['ingest', 'read'] })).secret;

    // ---- 1. Intake throughput vs raw COPY -------------------------------------------------
    const start = Math.floor(Date.now() / 3_600_000) * 3_600_000 - 2 * 3_600_000;
    const timesOf = (b: number) => Array.from({ length: POINTS_PER_SERIES }, (_, k) => start + (b * POINTS_PER_SERIES + k) * 1000);
    const value = (s: number, k: number) => s + k;
    // Warm-up (not timed): creates the series and today's partitions, as a running system has them.
    await post(`${base}/v1/metrics`, token, otlpBatch('bench', 'bench.requests', timesOf(0), value));
    // Serialised to bytes before the clock starts, as the COPY side's files are written before
    // its clock starts: the client shares this process, and encoding 2.5 MB strings per request
    // would be charged to the intake.
    const bodies = Array.from({ length: BATCHES }, (_, b) => Buffer.from(otlpBatch('bench', 'bench.requests', timesOf(b + 1), value), 'utf8'));
    const cpu0 = { node: process.cpuUsage(), pg: cluster.cpuMs() };
    const t0 = performance.now();
    let next = 0;
    await Promise.all(
      Array.from({ length: CONCURRENCY }, async () => {
        while (next < bodies.length) await post(`${base}/v1/metrics`, token, bodies[next++]!);
      }),
    );
    const httpSeconds = (performance.now() - t0) / 1000;
    const nodeCpu = process.cpuUsage(cpu0.node);
    const httpCpu = { node: (nodeCpu.user + nodeCpu.system) / 1000, pg: diff(cluster.cpuMs(), cpu0.pg) };
    const points = BATCHES * SERIES * POINTS_PER_SERIES;

    // The same rows, as COPY sees them, into a table of the same shape.
    const ids = (await db.raw(`SELECT x.id, x.labels->>'instance' AS instance FROM series x JOIN signals g ON g.id = x.signal_id WHERE g.name = 'bench.requests'`)).rows as { id: number; instance: string }[];
    const idOf = new Map(ids.map((r) => [Number(r.instance.slice(2)), r.id]));
    await db.raw(`CREATE TABLE samples_copy (series_id bigint NOT NULL, t timestamptz NOT NULL, value double precision NOT NULL, PRIMARY KEY (series_id, t)) PARTITION BY RANGE (t)`);
    const days = new Set<string>();
    const files: string[] = [];
    for (let b = 1; b <= BATCHES; b++) {
      const lines: string[] = [];
      const times = timesOf(b);
      for (let s = 0; s < SERIES; s++) times.forEach((t, k) => lines.push(`${idOf.get(s)},${new Date(t).toISOString()},${value(s, k)}`));
      times.forEach((t) => days.add(new Date(t).toISOString().slice(0, 10)));
      const f = path.join(tmp, `batch-${b}.csv`);
      fs.writeFileSync(f, lines.join('\n') + '\n');
      files.push(f);
    }
    for (const d of days) await db.raw('SELECT signals_ensure_day_partition(?, ?::date)', ['samples_copy', d]);
    const script = path.join(tmp, 'copy.sql');
    fs.writeFileSync(script, files.map((f) => `\\copy samples_copy (series_id, t, value) FROM '${f}' WITH (FORMAT csv)`).join('\n') + '\n');
    const psql = findPsql();
    const cpu1 = { psql: childrenCpuMs(), pg: cluster.cpuMs() };
    const t1 = performance.now();
    execFileSync(psql, ['-X', '-q', '-v', 'ON_ERROR_STOP=1', '-h', '127.0.0.1', '-p', String(PORT), '-U', 'postgres', '-d', 'bench', '-f', script], {
      env: { ...process.env, PGPASSWORD: settings.password },
      stdio: ['ignore', 'ignore', 'inherit'],
    });
    const copySeconds = (performance.now() - t1) / 1000;
    const copyCpu = { psql: diff(childrenCpuMs(), cpu1.psql), pg: diff(cluster.cpuMs(), cpu1.pg) };
    const copied = Number((await db.raw('SELECT count(*) AS n FROM samples_copy')).rows[0].n);
    const stored = Number((await db.raw(`SELECT count(*) AS n FROM samples s JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id WHERE g.name = 'bench.requests'`)).rows[0].n);
    if (copied !== points || stored !== points + SERIES * POINTS_PER_SERIES) throw new Error(`row counts differ: copy ${copied}, intake ${stored}`);

    const httpRate = points / httpSeconds;
    const copyRate = points / copySeconds;
    console.log(`[bench] ${BATCHES} OTLP/JSON batches of ${SERIES * POINTS_PER_SERIES} points, ${CONCURRENCY} in flight`);
    console.log(`[bench] intake over HTTP : ${Math.round(httpRate).toLocaleString('en')} points/s (${httpSeconds.toFixed(2)} s)`);
    console.log(`[bench] raw COPY (psql)  : ${Math.round(copyRate).toLocaleString('en')} points/s (${copySeconds.toFixed(2)} s)`);
    console.log(`[bench] ratio intake/COPY: ${(httpRate / copyRate).toFixed(2)} (target ≥ 0.5)`);
    // CPU time per batch is far steadier than wall time on a shared machine (load average beside it).
    const perBatch = (ms: number | null) => (ms === null ? '?' : (ms / BATCHES).toFixed(0));
    console.log(
      `[bench] CPU per batch    : intake ${perBatch(httpCpu.node)} ms (this process, client included) + PostgreSQL ${perBatch(httpCpu.pg)} ms; ` +
        `COPY psql ${perBatch(copyCpu.psql)} ms + PostgreSQL ${perBatch(copyCpu.pg)} ms; load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`,
    );

    // ---- 2. A 24 h rate query over 1 000 series --------------------------------------------
    if (process.env.BENCH_SKIP_QUERY) return;
    const end = Math.floor(Date.now() / 60_000) * 60_000;
    const dayStart = end - 86_400_000;
    await post(`${base}/v1/metrics`, token, otlpBatch('bench', 'bench.day.requests', [dayStart], () => 0));
    for (const d of [dayStart, end]) await db.raw('SELECT signals_ensure_day_partition(?, ?::date)', ['samples', new Date(d).toISOString().slice(0, 10)]);
    // One sample a minute for 24 h (1 441 per series), written directly: only the query is timed.
    await db.raw(
      `INSERT INTO samples (series_id, t, value)
       SELECT x.id, to_timestamp(? / 1000.0) + k * interval '1 minute', k * (1 + x.id % 7)
       FROM series x JOIN signals g ON g.id = x.signal_id CROSS JOIN generate_series(0, 1440) k
       WHERE g.name = 'bench.day.requests' ON CONFLICT DO NOTHING`,
      [dayStart],
    );
    await db.raw('ANALYZE samples');
    const rows = Number((await db.raw(`SELECT count(*) AS n FROM samples s JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id WHERE g.name = 'bench.day.requests'`)).rows[0].n);
    const q = new URLSearchParams({ service: 'bench', signal: 'bench.day.requests', fn: 'rate', window: '5m', step: '5m', from: String(dayStart), to: String(end), by: 'zone' });
    const latencies: number[] = [];
    let groups = 0;
    for (let r = 0; r <= QUERY_RUNS; r++) {
      const tq = performance.now();
      const res = await fetch(`${base}/api/signals/query?${q}`, { headers: { authorization: `Bearer ${token}` } });
      const body = (await res.json()) as { groups?: unknown[] };
      if (res.status !== 200) throw new Error(`query answered ${res.status}: ${JSON.stringify(body).slice(0, 300)}`);
      groups = body.groups!.length;
      if (r > 0) latencies.push(performance.now() - tq); // the first run warms caches
    }
    latencies.sort((a, b) => a - b);
    console.log(`[bench] 24 h rate over ${SERIES} series (${rows.toLocaleString('en')} samples, 5 min window and step, ${groups} groups by zone)`);
    console.log(`[bench] query latency: median ${latencies[Math.floor(latencies.length / 2)]!.toFixed(0)} ms, best ${latencies[0]!.toFixed(0)} ms, worst ${latencies[latencies.length - 1]!.toFixed(0)} ms over ${QUERY_RUNS} runs`);
  } finally {
    agent.destroy();
    if (server) await new Promise((r) => server!.close(r));
    await db?.destroy();
    await pool?.end();
    cluster.destroy();
    fs.rmSync(tmp, { recursive: true, force: true });
    console.log('[bench] private cluster stopped and removed');
  }
}

main().catch((e) => {
  console.error('[bench] failed:', e);
  process.exit(1);
});
