import type { Knex } from 'knex';

// A vantage is a named place that runs journeys; its liveness comes from worker_heartbeats (a
// worker started with PARALLAX_VANTAGE=<name> beats under that name).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('vantages', (t) => {
    t.text('name').primary();
    t.text('region').notNullable().defaultTo('');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('vantages');
}
