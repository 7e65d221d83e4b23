// The real server (real web build, real database) listening on a free loopback port; optionally
// with a worker for vantage "local" (heartbeat + prober) and the demo target, as `npm start` runs.
import crypto from 'node:crypto';
import http from 'node:http';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import type PgBoss from 'pg-boss';
import { createApp } from '../../server/app';
import { usersService } from '../../server/services/users';
import { buildWeb } from '../../scripts/build-web';
import { startDemoTarget, type DemoTarget } from '../../scripts/demo-target';
import { startBoss } from '../../worker/boss';
import { startHeartbeat } from '../../worker/heartbeat';
import { startProber } from '../../worker/probe-job';
import { createTestDb, pgPool, type TestDb } from './db';

export interface LiveServer {
  url: string;
  db: TestDb;
  admin: { email: string; password: string };
  /** Present with { worker: true }. */
  demo?: DemoTarget;
  boss?: PgBoss;
  secretKey: Buffer;
  close(): Promise<void>;
}

export async function startLiveServer(opts: { worker?: boolean } = {}): Promise<LiveServer> {
  buildWeb(false);
  const db = await createTestDb();
  const pool = pgPool(db.settings);
  const admin = (await usersService(db.knex).bootstrapAdmin({}))!;
  const secretKey = crypto.randomBytes(32);
  const stops: (() => Promise<unknown>)[] = [];
  let boss: PgBoss | undefined;
  let demo: DemoTarget | undefined;
  if (opts.worker) {
    boss = await startBoss(db.settings);
    demo = await startDemoTarget({ port: 0 });
    await db.knex('vantages').insert({ name: 'local', region: 'this machine' });
    await db.knex('settings').insert({ key: 'target_policy', value: JSON.stringify({ allowLoopback: true }) });
    stops.push(await startHeartbeat(boss, db.knex, { name: 'local', beatSeconds: 5 }));
    stops.push(await startProber(boss, db.knex, { vantage: 'local', secretKey, concurrency: 2 }));
    const b = boss;
    const d = demo;
    stops.push(() => d.close(), () => b.stop({ graceful: false, wait: true }));
  }
  const app = createApp({
    db: db.knex,
    sessionPool: pool,
    sessionSecret: crypto.randomBytes(32).toString('hex'),
    secretKey,
    boss,
    webDir: path.resolve(__dirname, '../../dist'),
    log: () => {},
  });
  const server = http.createServer(app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    db,
    admin,
    demo,
    boss,
    secretKey,
    async close() {
      server.closeAllConnections();
      await new Promise((r) => server.close(r));
      for (const stop of stops) await stop().catch(() => {});
      await pool.end();
      await db.drop();
    },
  };
}
