import type { Knex } from 'knex';

// Which internal services a journey exercises (needed to line episodes up with signals).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('journey_services', (t) => {
    t.bigInteger('journey_id').notNullable().references('journeys.id').onDelete('CASCADE');
    t.bigInteger('service_id').notNullable().references('services.id').onDelete('CASCADE');
    t.primary(['journey_id', 'service_id']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('journey_services');
}
