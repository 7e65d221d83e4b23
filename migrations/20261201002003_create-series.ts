import type { Knex } from 'knex';

// One signal with one label set. labels_hash is a hash of the canonical (key-sorted) label JSON,
// so "the same labels" is one unique lookup whatever order the sender wrote them in.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('series', (t) => {
    t.bigIncrements('id');
    t.bigInteger('signal_id').notNullable().references('signals.id').onDelete('CASCADE');
    t.jsonb('labels').notNullable().defaultTo('{}');
    t.text('labels_hash').notNullable();
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_sample_at', { useTz: true });
    t.unique(['signal_id', 'labels_hash']);
  });
  // Label filters in the query API are containment tests (labels @> '{"route":"/pay"}').
  await knex.raw('CREATE INDEX series_labels_idx ON series USING gin (labels jsonb_path_ops)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('series');
}
