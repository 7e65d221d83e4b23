import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('api_tokens', (t) => {
    t.bigIncrements('id');
    t.text('name').notNullable();
    t.text('prefix').notNullable();
    // SHA-256 of the whole secret: tokens are long random strings, so a slow hash adds nothing.
    t.text('token_hash').notNullable().unique();
    t.specificType('scopes', 'text[]').notNullable();
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_used_at', { useTz: true });
    t.timestamp('revoked_at', { useTz: true });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('api_tokens');
}
