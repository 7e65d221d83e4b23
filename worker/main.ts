// A worker process: one vantage (PARALLAX_VANTAGE) or extra capacity in one. Every worker offers
// to lead the scheduler (one wins the advisory lock), probes its vantage's queue and beats.
import os from 'node:os';
import { dbSettings } from '../server/config';
import { createKnex } from '../server/db/knex';
import { loadSecretKey } from '../server/secrets/cipher';
import { startBoss } from './boss';
import { startCollector } from './collector/collector';
import { startEvaluator } from './evaluator/evaluator';
import { startNotifier } from './notifier/notifier';
import { startHeartbeat } from './heartbeat';
import { startProber } from './probe-job';
import { startRetention } from './retention';
import { createScheduler } from './scheduler';

async function main() {
  const settings = dbSettings();
  const db = createKnex(settings, { max: 8 });
  const boss = await startBoss(settings);
  const vantage = process.env.PARALLAX_VANTAGE ?? `worker-${os.hostname()}`;
  // A worker announces its vantage, so journeys can choose it.
  await db('vantages').insert({ name: vantage, region: process.env.PARALLAX_REGION ?? '' }).onConflict('name').ignore();

  const stopBeat = await startHeartbeat(boss, db, { name: vantage, beatSeconds: Number(process.env.PARALLAX_BEAT_SECONDS ?? 15) });
  const stopProber = await startProber(boss, db, {
    vantage,
    secretKey: loadSecretKey(),
    concurrency: Number(process.env.PARALLAX_PROBE_CONCURRENCY ?? 8),
  });
  const scheduler = createScheduler(boss, db, settings);
  scheduler.start();
  await startRetention(boss, db);
  // JSON endpoint collection, plus signal partitions ahead, rollups and raw-sample retention.
  const stopCollector = await startCollector(boss, db);
  // Alert rules: one leader evaluates every cycle; the notifier sends mail and webhooks from the outbox.
  const evaluator = await startEvaluator(boss, db);
  const notifier = await startNotifier(boss, db, { secretKey: loadSecretKey() });
  console.log(`[worker] vantage ${vantage} started`);

  const stop = async () => {
    await scheduler.stop().catch(() => {});
    await stopCollector().catch(() => {});
    await evaluator.stop().catch(() => {});
    await notifier.stop().catch(() => {});
    await stopProber().catch(() => {});
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
