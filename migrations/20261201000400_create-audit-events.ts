import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_events', (t) => {
    t.bigIncrements('id');
    t.timestamp('at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.text('actor_type').notNullable(); // user | token | system
    t.bigInteger('actor_id');
    t.text('actor_label').notNullable();
    t.text('action').notNullable();
    t.text('subject_type').notNullable();
    t.text('subject_id');
    t.jsonb('detail').notNullable().defaultTo('{}');
    t.index(['at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('audit_events');
}
