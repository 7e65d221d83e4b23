import type { Knex } from 'knex';

// Small admin-managed settings (target rules, run retention) as one JSON value per key.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('settings', (t) => {
    t.text('key').primary();
    t.jsonb('value').notNullable();
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('settings');
}
