// The API and web server process (started by scripts/start.ts, or on its own behind a balancer).
import http from 'node:http';
import path from 'node:path';
import pg from 'pg';
import { createApp } from './app';
import { dataDir, dbSettings, httpPort, repoRoot } from './config';
import { createKnex } from './db/knex';
import { readOrCreateSecret } from './secrets-file';
import { loadSecretKey } from './secrets/cipher';
import { startBoss } from '../worker/boss';

async function main() {
  const settings = dbSettings();
  const db = createKnex(settings, { max: 10 });
  const sessionPool = new pg.Pool({ ...settings, max: 4 });
  // Send-only queue access ("try it now"); supervision is the workers' job.
  const boss = await startBoss(settings, { supervise: false, schedule: false });
  const app = createApp({
    secretKey: loadSecretKey(),
    boss,
    db,
    sessionPool,
    sessionSecret: process.env.PARALLAX_SESSION_SECRET ?? readOrCreateSecret(dataDir(), 'session-secret'),
    webDir: process.env.PARALLAX_WEB_DIR ?? path.join(repoRoot, 'dist'),
    trustProxy: process.env.PARALLAX_TRUST_PROXY ? Number(process.env.PARALLAX_TRUST_PROXY) : false,
  });
  const host = process.env.PARALLAX_HOST ?? '127.0.0.1';
  const port = httpPort();
  const server = http.createServer(app);
  server.once('listening', () => console.log(`[server] listening on http://${host}:${port}`));
  server.listen(port, host);
  server.on('error', (e) => {
    console.error(`[server] cannot listen on ${host}:${port}: ${e.message}`);
    process.exit(1);
  });

  const stop = () => {
    server.close(async () => {
      await Promise.allSettled([db.destroy(), sessionPool.end(), boss.stop({ graceful: false })]);
      process.exit(0);
    });
    server.closeAllConnections();
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.once('SIGTERM', stop);
  process.once('SIGINT', stop);
}

main().catch((e) => {
  console.error('[server] failed to start:', e);
  process.exit(1);
});
