// Upkeep of the signal tables (DESIGN.md §8): daily partitions made ahead of time, raw days past
// their retention rolled up into one-minute rows and dropped whole, old rollups deleted.
import type { Knex } from 'knex';
import { DAY_MS, dayOf, partitionsRepo, PARTITIONED_TABLES } from './repositories/partitions-repo';

export interface RetentionSettings {
  /** Days of raw samples and histogram points kept (default 14). */
  rawDays: number;
  /** Days of one-minute rollups kept (default 400). */
  rollupDays: number;
}

export function retentionFromEnv(env: NodeJS.ProcessEnv = process.env): RetentionSettings {
  return { rawDays: Number(env.PARALLAX_SIGNALS_RAW_DAYS ?? 14), rollupDays: Number(env.PARALLAX_SIGNALS_ROLLUP_DAYS ?? 400) };
}

export interface MaintenanceReport {
  partitionsEnsured: number;
  rolledUpPartitions: string[];
  rollupRows: number;
  droppedPartitions: string[];
  deletedRollups: number;
}

export function signalsMaintenance(db: Knex, settings: RetentionSettings = retentionFromEnv(), now: () => Date = () => new Date()) {
  return {
    /** Idempotent: running it twice in a row changes nothing the second time. */
    async run(): Promise<MaintenanceReport> {
      const today = dayOf(now().getTime());
      const report: MaintenanceReport = { partitionsEnsured: 0, rolledUpPartitions: [], rollupRows: 0, droppedPartitions: [], deletedRollups: 0 };
      for (const table of PARTITIONED_TABLES) {
        await partitionsRepo.ensureDays(db, table, [today, today + DAY_MS]);
        report.partitionsEnsured += 2;
      }
      // A day is past retention when all of it is older than rawDays before today's start.
      const cutoff = today - settings.rawDays * DAY_MS;
      for (const p of await partitionsRepo.list(db, 'samples')) {
        if (p.dayMs >= cutoff) continue;
        report.rollupRows += await partitionsRepo.rollUpAndDropSamples(db, p);
        report.rolledUpPartitions.push(p.name);
      }
      for (const p of await partitionsRepo.list(db, 'histogram_points')) {
        if (p.dayMs >= cutoff) continue;
        await partitionsRepo.drop(db, 'histogram_points', p);
        report.droppedPartitions.push(p.name);
      }
      report.deletedRollups = await partitionsRepo.deleteRollupsBefore(db, today - settings.rollupDays * DAY_MS);
      return report;
    },
  };
}
