import type { Knex } from 'knex';

// Counter and gauge samples, range-partitioned by day (samples_pYYYYMMDD) so retention drops whole
// partitions. (series_id, t) is the primary key: a re-sent point is a conflict that inserts
// nothing, which makes every intake path idempotent. No foreign key to series: it would cost a
// lookup per inserted row, and series are never deleted while their samples are kept.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE samples (
      series_id bigint NOT NULL,
      t timestamptz NOT NULL,
      value double precision NOT NULL,
      PRIMARY KEY (series_id, t)
    ) PARTITION BY RANGE (t)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE samples');
}
