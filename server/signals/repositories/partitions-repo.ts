// Daily partitions of the time-partitioned signal tables, and retention: a raw day past its
// retention is rolled up into one-minute rows and dropped in one transaction.
import type { Knex } from 'knex';

export const PARTITIONED_TABLES = ['samples', 'histogram_points'] as const;
export type PartitionedTable = (typeof PARTITIONED_TABLES)[number];

const DAY_MS = 86_400_000;

export interface PartitionInfo {
  name: string;
  /** The UTC day it holds, as ms at 00:00. */
  dayMs: number;
}

export function dayText(dayMs: number): string {
  return new Date(dayMs).toISOString().slice(0, 10);
}

export const partitionsRepo = {
  /** Creates the daily partitions for the given days (ms at 00:00 UTC); existing ones are kept. */
  async ensureDays(db: Knex, table: PartitionedTable, days: number[]): Promise<void> {
    for (const d of days) {
      await db.raw('SELECT signals_ensure_day_partition(?, ?::date)', [table, dayText(d)]);
    }
  },

  async list(db: Knex, table: PartitionedTable): Promise<PartitionInfo[]> {
    const rows = (
      await db.raw(
        `SELECT c.relname AS name FROM pg_inherits i JOIN pg_class c ON c.oid = i.inhrelid
         WHERE i.inhparent = ?::regclass ORDER BY c.relname`,
        [table],
      )
    ).rows as { name: string }[];
    const out: PartitionInfo[] = [];
    for (const r of rows) {
      const m = /_p(\d{4})(\d{2})(\d{2})$/.exec(r.name);
      if (m) out.push({ name: r.name, dayMs: Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) });
    }
    return out;
  },

  /**
   * Rolls one raw samples partition up into sample_rollups and drops it, atomically. A minute
   * already rolled up (the day was imported again after an earlier rollup) is left as it was.
   */
  async rollUpAndDropSamples(db: Knex, partition: PartitionInfo): Promise<number> {
    if (!/^samples_p\d{8}$/.test(partition.name)) throw new Error(`not a samples partition: ${partition.name}`);
    return db.transaction(async (tx) => {
      const r = await tx.raw(
        `INSERT INTO sample_rollups (series_id, t, last_t, last, min, max, sum, count)
         SELECT series_id, date_trunc('minute', t) AS m,
                max(t), (array_agg(value ORDER BY t DESC))[1], min(value), max(value), sum(value), count(*)
         FROM ${partition.name} GROUP BY series_id, m
         ON CONFLICT (series_id, t) DO NOTHING`,
      );
      await tx.raw(`DROP TABLE ${partition.name}`);
      return r.rowCount ?? 0;
    });
  },

  async drop(db: Knex, table: PartitionedTable, partition: PartitionInfo): Promise<void> {
    if (!new RegExp(`^${table}_p\\d{8}$`).test(partition.name)) throw new Error(`not a ${table} partition: ${partition.name}`);
    await db.raw(`DROP TABLE ${partition.name}`);
  },

  async deleteRollupsBefore(db: Knex, beforeMs: number): Promise<number> {
    const r = await db.raw('DELETE FROM sample_rollups WHERE t < to_timestamp(? / 1000.0)', [beforeMs]);
    return r.rowCount ?? 0;
  },
};

export function dayOf(ms: number): number {
  return Math.floor(ms / DAY_MS) * DAY_MS;
}
export { DAY_MS };
