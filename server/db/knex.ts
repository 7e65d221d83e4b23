import knexFactory, { type Knex } from 'knex';
import pg from 'pg';
import type { DbSettings } from '../config';
import { migrationSource } from './migration-source';

// bigint (int8) ids and counts come back as strings by default; ours fit in a JS number.
pg.types.setTypeParser(20, (v: string) => Number(v));

export function createKnex(db: DbSettings, pool: { min?: number; max?: number } = {}): Knex {
  return knexFactory({
    client: 'pg',
    connection: { ...db },
    pool: { min: pool.min ?? 0, max: pool.max ?? 10 },
    migrations: { migrationSource, tableName: 'knex_migrations' },
  });
}

export async function migrateLatest(knex: Knex): Promise<string[]> {
  const [, applied] = await knex.migrate.latest();
  return applied as string[];
}
