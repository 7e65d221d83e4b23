import type { Knex } from 'knex';

// An internal system whose metrics Parallax receives (DESIGN.md §3). Created on first sight by the
// intake (OTLP `service.name`, JSON batch, CSV, collection target) or by an engineer; journeys
// name the services they exercise (journey_services).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('services', (t) => {
    t.bigIncrements('id');
    t.text('name').notNullable().unique();
    t.text('description').notNullable().defaultTo('');
    t.text('owner').notNullable().defaultTo('');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('services');
}
