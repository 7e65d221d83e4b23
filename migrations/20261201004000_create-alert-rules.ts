import type { Knex } from 'knex';

// Alert rules (issue 5): the zod-validated document (shared/rules/rule-schema.ts) plus the columns
// lists and the evaluator filter on. `version` grows with every change to the document, so the
// evaluator can tell that a rule changed under it mid-cycle. Rules are deleted softly: their
// alerts stay as history (and as evidence for findings).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('alert_rules', (t) => {
    t.bigIncrements('id');
    t.text('name').notNullable();
    t.text('kind').notNullable();
    t.bigInteger('service_id').notNullable().references('services.id');
    t.jsonb('document').notNullable();
    t.boolean('enabled').notNullable().defaultTo(true);
    t.integer('version').notNullable().defaultTo(1);
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.bigInteger('updated_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('deleted_at', { useTz: true });
  });
  await knex.raw('CREATE INDEX alert_rules_live_idx ON alert_rules (service_id) WHERE deleted_at IS NULL');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('alert_rules');
}
