// A worker process: one vantage (PARALLAX_VANTAGE) or extra capacity. Jobs arrive through pg-boss.
import os from 'node:os';
import { dbSettings } from '../server/config';
import { createKnex } from '../server/db/knex';
import { startBoss } from './boss';
import { startHeartbeat } from './heartbeat';

async function main() {
  const settings = dbSettings();
  const db = createKnex(settings, { max: 5 });
  const boss = await startBoss(settings);
  const name = process.env.PARALLAX_VANTAGE ?? `worker-${os.hostname()}`;
  const stopBeat = await startHeartbeat(boss, db, { name, beatSeconds: Number(process.env.PARALLAX_BEAT_SECONDS ?? 15) });
  console.log(`[worker] ${name} started`);

  const stop = async () => {
    await stopBeat().catch(() => {});
    await boss.stop({ graceful: true, timeout: 5000 }).catch(() => {});
    await db.destroy();
    process.exit(0);
  };
  process.once('SIGTERM', stop);
  process.once('SIGINT', stop);
}

main().catch((e) => {
  console.error('[worker] failed to start:', e);
  process.exit(1);
});
