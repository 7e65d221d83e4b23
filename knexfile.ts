// Knex CLI configuration. Prefer `npm run migrate`; the CLI works as
// `NODE_OPTIONS='--import tsx' npx knex --knexfile knexfile.ts migrate:latest`.
import { dbSettings } from './server/config';
import { migrationSource } from './server/db/migration-source';

export default {
  client: 'pg',
  connection: dbSettings(),
  migrations: { migrationSource, tableName: 'knex_migrations' },
};
