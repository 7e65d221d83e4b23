// Each test file gets its own database, cloned from the migrated template.
import crypto from 'node:crypto';
import type { Knex } from 'knex';
import pg from 'pg';
import { inject } from 'vitest';
import { dbSettings, type DbSettings } from '../../server/config';
import { createKnex } from '../../server/db/knex';

export interface TestDb {
  knex: Knex;
  settings: DbSettings;
  env: NodeJS.ProcessEnv;
  drop(): Promise<void>;
}

export function testEnv(): NodeJS.ProcessEnv {
  return { ...process.env, ...inject('testEnv') };
}

export async function createTestDb(): Promise<TestDb> {
  const env = testEnv();
  const name = `${inject('testDbPrefix')}${crypto.randomBytes(6).toString('hex')}`;
  const admin = createKnex(dbSettings(env, 'postgres'), { max: 1 });
  try {
    await admin.raw(`CREATE DATABASE ${name} TEMPLATE ${inject('templateDb')}`);
  } finally {
    await admin.destroy();
  }
  const settings = dbSettings(env, name);
  const knex = createKnex(settings);
  return {
    knex,
    settings,
    env,
    async drop() {
      await knex.destroy();
      const a = createKnex(dbSettings(env, 'postgres'), { max: 1 });
      try {
        await a.raw(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      } finally {
        await a.destroy();
      }
    },
  };
}

export function pgPool(settings: DbSettings): pg.Pool {
  return new pg.Pool({ ...settings, max: 4 });
}
