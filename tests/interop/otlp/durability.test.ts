// Durability of the intake (issue 4): every point acknowledged before a PostgreSQL restart is there
// after it, and while the database is down the intake answers 503 with Retry-After (a status OTLP
// clients retry) instead of accepting and dropping. This file runs its own cluster (another port
// and data directory) because it stops the database; the shared test cluster is never touched.
import crypto from 'node:crypto';
import http from 'node:http';
import type { Knex } from 'knex';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../../server/app';
import { createKnex } from '../../../server/db/knex';
import { usersRepo } from '../../../server/repositories/users';
import { tokensService } from '../../../server/services/tokens';
import { freePort, privateCluster, type PrivateCluster } from '../../../bench/lib/private-cluster';
import { exportRequest, sumMetric } from '../../api/signals/otlp-fixtures';

let cluster: PrivateCluster;
let db: Knex;
let pool: pg.Pool;
let server: http.Server;
let endpoint: string;
let token: string;

beforeAll(async () => {
  const port = Number(process.env.PARALLAX_DURABILITY_DB_PORT ?? (await freePort()));
  cluster = privateCluster({ port, label: 'durability' });
  cluster.start();
  const settings = await cluster.createMigratedDatabase('parallax');
  // Short waits for a connection, so a request during the outage fails fast into a 503.
  db = createKnex(settings);
  pool = new pg.Pool({ ...settings, max: 2 });
  pool.on('error', () => {});
  const app = createApp({
    db,
    sessionPool: pool,
    sessionSecret: crypto.randomBytes(32).toString('hex'),
    secretKey: crypto.randomBytes(32),
    log: () => {},
  });
  server = http.createServer(app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  endpoint = `http://127.0.0.1:${(server.address() as { port: number }).port}/v1/metrics`;
  const admin = await usersRepo.insert(db, { email: 'admin@example.test', name: 'Admin', role: 'admin', passwordHash: 'unused' });
  token = (await tokensService(db).create({ type: 'user', id: admin.id, email: admin.email, name: admin.name, role: 'admin' }, { name: 'ingest', scopes: ['ingest'] })).secret;
}, 120_000);

afterAll(async () => {
  await new Promise((r) => server?.close(r));
  await db?.destroy();
  await pool?.end().catch(() => {});
  cluster?.destroy();
}, 120_000);

const T0 = Date.UTC(2026, 3, 1, 0, 0, 0);

/** One OTLP/JSON export with a point per series at instant T0 + i seconds. */
async function sendBatch(i: number): Promise<{ status: number; retryAfter: string | null }> {
  const body = JSON.stringify(
    exportRequest('durable', [
      sumMetric(
        'requests',
        ['a', 'b', 'c'].map((route) => ({ t: T0 + i * 1000, value: i, labels: { route } })),
      ),
    ]),
  );
  try {
    const res = await fetch(endpoint, { method: 'POST', headers: { authorization: `Bearer ${token}`, 'content-type': 'application/json' }, body });
    await res.arrayBuffer();
    return { status: res.status, retryAfter: res.headers.get('retry-after') };
  } catch {
    return { status: 0, retryAfter: null };
  }
}

describe('intake across a PostgreSQL restart', () => {
  it('keeps every acknowledged point and answers 503 with Retry-After while the database is down', async () => {
    const outcomes = new Map<number, { status: number; retryAfter: string | null }>();
    let i = 0;
    let running = true;
    let sawOutage = false;
    let sawRecovery = false;
    // A client exporting without pause while the database goes down and comes back.
    const client = (async () => {
      while (running && i < 5000) {
        const n = i++;
        const o = await sendBatch(n);
        outcomes.set(n, o);
        if (o.status === 503) sawOutage = true;
        if (sawOutage && o.status === 200) sawRecovery = true;
        if (o.status !== 200) await new Promise((r) => setTimeout(r, 50));
      }
    })();

    const waitFor = async (cond: () => boolean, what: string) => {
      for (let k = 0; k < 600 && !cond(); k++) await new Promise((r) => setTimeout(r, 50));
      if (!cond()) throw new Error(`gave up waiting for ${what}`);
    };
    await waitFor(() => [...outcomes.values()].filter((o) => o.status === 200).length >= 10, 'ten acknowledged batches');
    cluster.stop();
    await waitFor(() => sawOutage, 'a 503 during the outage');
    // A request made now, with the database certainly down.
    const during = await sendBatch(100_000);
    expect(during.status).toBe(503);
    expect(Number(during.retryAfter)).toBeGreaterThan(0);
    cluster.start();
    await waitFor(() => sawRecovery, 'acknowledgements after the restart');
    running = false;
    await client;

    const statuses = [...outcomes.values()];
    // Nothing but acknowledgements and retryable refusals, the latter always with Retry-After.
    for (const o of statuses) {
      expect([200, 503]).toContain(o.status);
      if (o.status === 503) expect(Number(o.retryAfter)).toBeGreaterThan(0);
    }
    const acked = [...outcomes.entries()].filter(([, o]) => o.status === 200).map(([n]) => n);
    expect(acked.length).toBeGreaterThan(10);

    const stored = await db.raw(
      `SELECT (extract(epoch FROM s.t) * 1000)::float8 AS ms, count(*)::int AS n FROM samples s GROUP BY 1`,
    );
    const perInstant = new Map((stored.rows as { ms: number; n: number }[]).map((r) => [r.ms, r.n]));
    const missing = acked.filter((n) => perInstant.get(T0 + n * 1000) !== 3);
    expect(missing).toEqual([]);
  }, 120_000);
});
