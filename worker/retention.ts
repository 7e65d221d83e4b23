// Run retention: whole daily partitions older than the admin's setting are dropped, hourly.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import { runsRepo } from '../server/repositories/runs';
import { probeSettingsService } from '../server/services/probe-settings';

const QUEUE = 'runs.retention';

export async function applyRunRetention(db: Knex, now: Date): Promise<string[]> {
  const days = await probeSettingsService(db).runRetentionDays();
  return runsRepo.dropPartitionsBefore(db, new Date(now.getTime() - days * 86_400_000));
}

export async function startRetention(boss: PgBoss, db: Knex): Promise<void> {
  await boss.createQueue(QUEUE);
  await boss.schedule(QUEUE, '17 * * * *', {}, { singletonKey: QUEUE });
  await boss.work(QUEUE, async () => {
    const dropped = await applyRunRetention(db, new Date());
    if (dropped.length) console.log(`[worker] retention dropped ${dropped.join(', ')}`);
  });
}
