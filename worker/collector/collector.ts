// The worker's part of internal signals: collecting from JSON endpoints on their intervals, and
// the hourly upkeep of the signal tables. Start it once per worker process:
//   const stopCollector = await startCollector(boss, db);
// Several workers may run it: targets are claimed with SKIP LOCKED (each slot goes to one
// worker) and each collection is one job, deduplicated per target and slot.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { collectJobSchema, SIGNAL_JOBS, type CollectJob } from '../../shared/jobs';
import { signalsMaintenance, type RetentionSettings } from '../../server/signals/maintenance-service';
import { collectionTargetsRepo } from '../../server/signals/repositories/collection-targets-repo';
import { collectTarget, type CollectOptions } from './collect-target';

export interface CollectorOptions extends CollectOptions {
  /** How often due targets are looked for (default 5 s; intervals are at least 5 s). */
  tickMs?: number;
  /** How often the signal tables are maintained (default hourly). */
  maintenanceMs?: number;
  retention?: RetentionSettings;
  log?: (msg: string) => void;
}

export async function startCollector(boss: PgBoss, db: Knex, opts: CollectorOptions = {}): Promise<() => Promise<void>> {
  const now = opts.now ?? (() => new Date());
  const log = opts.log ?? ((m: string) => console.error(`[collector] ${m}`));
  await boss.createQueue(SIGNAL_JOBS.collect);
  await boss.createQueue(SIGNAL_JOBS.maintain);

  await boss.work<CollectJob>(SIGNAL_JOBS.collect, { pollingIntervalSeconds: 0.5, batchSize: 4 }, async (jobs) => {
    for (const job of jobs) {
      const { targetId, slotMs } = collectJobSchema.parse(job.data);
      const target = await collectionTargetsRepo.byId(db, targetId);
      if (!target || !target.enabled) continue; // deleted or paused since it was claimed
      await collectTarget(db, target, slotMs, opts);
    }
  });
  const maintenance = signalsMaintenance(db, opts.retention, now);
  await boss.work(SIGNAL_JOBS.maintain, { pollingIntervalSeconds: 2 }, async () => {
    const r = await maintenance.run();
    if (r.rolledUpPartitions.length || r.droppedPartitions.length)
      log(`rolled up ${r.rolledUpPartitions.join(', ') || 'nothing'}; dropped ${r.droppedPartitions.join(', ') || 'nothing'}`);
  });

  let stopped = false;
  const claim = async () => {
    if (stopped) return;
    try {
      for (const t of await collectionTargetsRepo.claimDue(db, now().getTime(), 100)) {
        await boss.send(SIGNAL_JOBS.collect, { targetId: t.id, slotMs: Math.round(t.slotMs) } satisfies CollectJob, {
          singletonKey: `collect:${t.id}:${Math.round(t.slotMs)}`,
          singletonSeconds: Math.max(1, t.intervalSeconds - 1),
          expireInSeconds: 60,
          retryLimit: 2,
        });
      }
    } catch (e) {
      log(`could not claim due targets: ${(e as Error).message}`);
    }
  };
  const maintain = () =>
    boss
      .send(SIGNAL_JOBS.maintain, {}, { singletonKey: 'signals.maintain', singletonSeconds: Math.max(60, Math.floor((opts.maintenanceMs ?? 3_600_000) / 1000) - 1), expireInSeconds: 15 * 60 })
      .catch((e: Error) => log(`maintenance not queued: ${e.message}`));

  await claim();
  await maintain();
  const claimTimer = setInterval(claim, opts.tickMs ?? 5000);
  const maintainTimer = setInterval(maintain, opts.maintenanceMs ?? 3_600_000);
  return async () => {
    stopped = true;
    clearInterval(claimTimer);
    clearInterval(maintainTimer);
    await boss.offWork(SIGNAL_JOBS.collect);
    await boss.offWork(SIGNAL_JOBS.maintain);
  };
}
