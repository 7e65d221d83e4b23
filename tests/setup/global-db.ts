// Starts the private test cluster with the same script `npm start` uses, and builds a migrated
// template database that every test file clones (CREATE DATABASE ... TEMPLATE is a file copy).
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { dbSettings } from '../../server/config';
import { createKnex, migrateLatest } from '../../server/db/knex';

const root = path.resolve(__dirname, '../..');

export const TEST_ENV = {
  PARALLAX_DATA_DIR: process.env.PARALLAX_TEST_DATA_DIR ?? path.join(root, '.data', 'test'),
  PARALLAX_DB_PORT: process.env.PARALLAX_TEST_DB_PORT ?? '54339',
};
export const TEMPLATE_DB = 'parallax_template';

export default async function setup(project: TestProject) {
  execFileSync('bash', [path.join(root, 'scripts/db.sh'), 'start'], {
    env: { ...process.env, ...TEST_ENV, PARALLAX_DB_MODE: 'test' },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const env = { ...process.env, ...TEST_ENV };
  const admin = createKnex(dbSettings(env, 'postgres'), { max: 1 });
  try {
    // Clones left by killed runs go first: their names all start with t_.
    const stale = await admin.raw("SELECT datname FROM pg_database WHERE datname LIKE 't\\_%'");
    for (const r of stale.rows as { datname: string }[]) await admin.raw(`DROP DATABASE IF EXISTS "${r.datname}" WITH (FORCE)`);
    await admin.raw(`DROP DATABASE IF EXISTS ${TEMPLATE_DB} WITH (FORCE)`);
    await admin.raw(`CREATE DATABASE ${TEMPLATE_DB}`);
  } finally {
    await admin.destroy();
  }
  const tpl = createKnex(dbSettings(env, TEMPLATE_DB), { max: 1 });
  try {
    await migrateLatest(tpl);
  } finally {
    await tpl.destroy();
  }
  project.provide('testEnv', TEST_ENV);
}

declare module 'vitest' {
  export interface ProvidedContext {
    testEnv: { PARALLAX_DATA_DIR: string; PARALLAX_DB_PORT: string };
  }
}
