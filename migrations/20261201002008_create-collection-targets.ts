import type { Knex } from 'knex';

// JSON endpoints the worker fetches on an interval; numbers in the document become signals of the
// service (keys flattened with '.'), the keys listed in counter_keys as counters, others as gauges.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('collection_targets', (t) => {
    t.bigIncrements('id');
    t.text('name').notNullable().unique();
    t.bigInteger('service_id').notNullable().references('services.id').onDelete('CASCADE');
    t.text('url').notNullable();
    t.integer('interval_seconds').notNullable();
    t.specificType('counter_keys', 'text[]').notNullable().defaultTo('{}');
    t.jsonb('labels').notNullable().defaultTo('{}');
    t.text('prefix').notNullable().defaultTo('');
    t.boolean('enabled').notNullable().defaultTo(true);
    t.timestamp('next_run_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_run_at', { useTz: true });
    t.text('last_error');
    t.integer('last_sample_count');
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.index(['enabled', 'next_run_at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('collection_targets');
}
