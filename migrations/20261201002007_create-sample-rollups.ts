import type { Knex } from 'knex';

// One-minute rollups of samples, written when a raw partition passes its retention (in the same
// transaction that drops it) and read for ranges older than the oldest raw partition.
// (last_t, last) is a real sample, so counter increases over rollups keep their reset handling.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TABLE sample_rollups (
      series_id bigint NOT NULL,
      t timestamptz NOT NULL,
      last_t timestamptz NOT NULL,
      last double precision NOT NULL,
      min double precision NOT NULL,
      max double precision NOT NULL,
      sum double precision NOT NULL,
      count integer NOT NULL,
      PRIMARY KEY (series_id, t)
    )`);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TABLE sample_rollups');
}
