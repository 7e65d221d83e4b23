import type { Knex } from 'knex';

// Every transition of an alert (pending, raised, no data, data back, cleared...) with its value:
// the alert's state spans on the detail chart.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('alert_events', (t) => {
    t.bigIncrements('id');
    t.bigInteger('alert_id').notNullable().references('alerts.id').onDelete('CASCADE');
    t.timestamp('at', { useTz: true }).notNullable();
    t.text('transition').notNullable();
    t.text('state').notNullable();
    t.double('value');
    t.index(['alert_id', 'at']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('alert_events');
}
