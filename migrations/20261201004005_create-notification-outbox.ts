import type { Knex } from 'knex';

// The notification outbox: one row per message (a transition × a channel), written in the same
// transaction as the state change, with its delivery job. The payload is a snapshot taken at the
// transition, so a retried delivery sends the same message. status moves pending → sent (or
// failed once retries are spent); the row is locked while it is sent, so a retry never sends twice.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('notification_outbox', (t) => {
    t.bigIncrements('id');
    t.bigInteger('alert_id').notNullable().references('alerts.id').onDelete('CASCADE');
    t.bigInteger('rule_id').notNullable();
    t.text('transition').notNullable();
    t.text('channel').notNullable().checkIn(['mail', 'webhook']);
    t.bigInteger('channel_id').references('notification_channels.id').onDelete('SET NULL');
    t.specificType('recipients', 'text[]').notNullable().defaultTo('{}');
    t.jsonb('payload').notNullable();
    t.text('status').notNullable().defaultTo('pending').checkIn(['pending', 'sent', 'failed']);
    t.integer('attempts').notNullable().defaultTo(0);
    t.text('last_error');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('sent_at', { useTz: true });
  });
  await knex.raw("CREATE INDEX notification_outbox_pending_idx ON notification_outbox (created_at) WHERE status = 'pending'");
  await knex.raw('CREATE INDEX notification_outbox_alert_idx ON notification_outbox (alert_id)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notification_outbox');
}
