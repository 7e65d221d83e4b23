import type { Knex } from 'knex';

// Where the scheduler leader got to, so a new leader after downtime knows which slots were missed.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('scheduler_state', (t) => {
    t.text('id').primary();
    t.timestamp('last_tick_at', { useTz: true }).notNullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('scheduler_state');
}
