import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.bigIncrements('id');
    t.text('email').notNullable().unique();
    t.text('name').notNullable();
    t.text('role').notNullable();
    t.text('password_hash').notNullable();
    t.timestamp('disabled_at', { useTz: true });
    t.timestamp('created_at', { useTz: true }).notNullable().defaultTo(knex.fn.now());
    t.timestamp('last_sign_in_at', { useTz: true });
  });
  await knex.raw(
    "ALTER TABLE users ADD CONSTRAINT users_role_check CHECK (role IN ('admin','engineer','release_manager','reviewer'))",
  );
  await knex.raw('ALTER TABLE users ADD CONSTRAINT users_email_lower CHECK (email = lower(email))');
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
