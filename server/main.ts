// The API and web server process (started by scripts/start.ts, or on its own behind a balancer).
import path from 'node:path';
import pg from 'pg';
import { createApp } from './app';
import { dataDir, dbSettings, httpPort, repoRoot } from './config';
import { createKnex } from './db/knex';
import { readOrCreateSecret } from './secrets-file';

async function main() {
  const settings = dbSettings();
  const db = createKnex(settings, { max: 10 });
  const sessionPool = new pg.Pool({ ...settings, max: 4 });
  const app = createApp({
    db,
    sessionPool,
    sessionSecret: process.env.PARALLAX_SESSION_SECRET ?? readOrCreateSecret(dataDir(), 'session-secret'),
    webDir: process.env.PARALLAX_WEB_DIR ?? path.join(repoRoot, 'dist'),
    trustProxy: process.env.PARALLAX_TRUST_PROXY ? Number(process.env.PARALLAX_TRUST_PROXY) : false,
  });
  const host = process.env.PARALLAX_HOST ?? '127.0.0.1';
  const port = httpPort();
  const server = app.listen(port, host, () => console.log(`[server] listening on http://${host}:${port}`));
  server.on('error', (e) => {
    console.error(`[server] cannot listen on ${host}:${port}: ${e.message}`);
    process.exit(1);
  });

  const stop = () => {
    server.close(async () => {
      await Promise.allSettled([db.destroy(), sessionPool.end()]);
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
