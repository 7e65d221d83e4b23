import type { Knex } from 'knex';

// Explicit-bucket histogram points (cumulative counts per bucket, as OTLP sends them; delta points
// are accumulated before they land here). Partitioned and keyed like samples.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE histogram_points (
      series_id bigint NOT NULL,
      t timestamptz NOT NULL,
      bounds double precision[] NOT NULL,
      counts bigint[] NOT NULL,
      sum double precision,
      count bigint NOT NULL,
      PRIMARY KEY (series_id, t)
    ) PARTITION BY RANGE (t)`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE histogram_points');
}
