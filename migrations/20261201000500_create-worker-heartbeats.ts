import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('worker_heartbeats', (t) => {
    t.text('name').primary();
    t.text('host').notNullable();
    t.integer('pid').notNullable();
    t.timestamp('started_at', { useTz: true }).notNullable();
    t.timestamp('last_beat_at', { useTz: true }).notNullable();
    t.integer('beat_seconds').notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('worker_heartbeats');
}
