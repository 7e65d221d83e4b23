import type { Knex } from 'knex';

// Planned periods per service: rules keep evaluating and recording, but send nothing and mark
// their alerts planned (DESIGN.md §3).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('maintenance_windows', (t) => {
    t.bigIncrements('id');
    t.bigInteger('service_id').notNullable().references('services.id').onDelete('CASCADE');
    t.timestamp('starts_at', { useTz: true }).notNullable();
    t.timestamp('ends_at', { useTz: true }).notNullable();
    t.text('reason').notNullable().defaultTo('');
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['service_id', 'ends_at']);
  });
  await knex.raw('ALTER TABLE maintenance_windows ADD CONSTRAINT maintenance_windows_order CHECK (ends_at > starts_at)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('maintenance_windows');
}
