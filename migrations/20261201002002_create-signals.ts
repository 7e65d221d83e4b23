import type { Knex } from 'knex';

// One internal metric of a service: name + kind + unit (DESIGN.md §3). The kind is fixed at first
// sight; points that arrive later under the same name with another kind are rejected.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('signals', (t) => {
    t.bigIncrements('id');
    t.bigInteger('service_id').notNullable().references('services.id').onDelete('CASCADE');
    t.text('name').notNullable();
    t.text('kind').notNullable().checkIn(['counter', 'gauge', 'histogram']);
    t.text('unit').notNullable().defaultTo('');
    t.text('description').notNullable().defaultTo('');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_sample_at', { useTz: true });
    t.unique(['service_id', 'name']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('signals');
}
