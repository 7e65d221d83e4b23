import type { Knex } from 'knex';

// The evaluator leader's last cycle: when, how long, how much, so "Now" can show that rules are
// being evaluated at all (a stopped evaluator must not look like a quiet service).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('evaluator_state', (t) => {
    t.text('id').primary();
    t.timestamp('last_cycle_at', { useTz: true }).notNullable();
    t.integer('last_cycle_ms').notNullable();
    t.integer('rules').notNullable();
    t.integer('groups').notNullable();
    t.text('last_error');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('evaluator_state');
}
