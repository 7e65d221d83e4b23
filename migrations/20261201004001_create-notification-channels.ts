import type { Knex } from 'knex';

// Where notifications go besides mail: generic JSON webhooks. The signing secret is needed in
// clear to sign (HMAC), so it is sealed with the server's AES-256-GCM key (server/secrets/cipher.ts)
// rather than hashed; only a short hint is kept readable.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('notification_channels', (t) => {
    t.bigIncrements('id');
    t.text('kind').notNullable().defaultTo('webhook').checkIn(['webhook']);
    t.text('name').notNullable().unique();
    t.text('url').notNullable();
    t.binary('secret_iv').notNullable();
    t.binary('secret_ciphertext').notNullable();
    t.binary('secret_tag').notNullable();
    t.text('secret_hint').notNullable();
    t.boolean('enabled').notNullable().defaultTo(true);
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('notification_channels');
}
