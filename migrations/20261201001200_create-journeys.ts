import type { Knex } from 'knex';

// Journeys are versioned: every save adds a row to journey_versions and moves current_version;
// runs point at the version they ran.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('journeys', (t) => {
    t.bigIncrements('id');
    t.text('name').notNullable();
    t.integer('current_version').notNullable();
    t.boolean('enabled').notNullable().defaultTo(true);
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
  await knex.schema.createTable('journey_versions', (t) => {
    t.bigInteger('journey_id').notNullable().references('journeys.id').onDelete('CASCADE');
    t.integer('version').notNullable();
    t.jsonb('document').notNullable();
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.primary(['journey_id', 'version']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('journey_versions');
  await knex.schema.dropTable('journeys');
}
