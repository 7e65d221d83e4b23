import type { Knex } from 'knex';

// Secret values encrypted with AES-256-GCM; the key never enters the database.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('secrets', (t) => {
    t.text('name').primary();
    t.binary('iv').notNullable();
    t.binary('ciphertext').notNullable();
    t.binary('tag').notNullable();
    t.bigInteger('created_by').references('users.id').onDelete('SET NULL');
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('updated_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('secrets');
}
