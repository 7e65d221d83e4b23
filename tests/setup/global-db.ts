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
// Names carry the pid of the run that made them, so concurrent runs (two developers' suites on
// one cluster) never touch each other's databases, and leftovers of dead runs can be told apart.
const RUN = String(process.pid);
const TEMPLATE_DB = `tpl_${RUN}`;

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (e) {
    return (e as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export default async function setup(project: TestProject) {
  execFileSync('bash', [path.join(root, 'scripts/db.sh'), 'start'], {
    env: { ...process.env, ...TEST_ENV, PARALLAX_DB_MODE: 'test' },
    stdio: ['ignore', 'inherit', 'inherit'],
  });
  const env = { ...process.env, ...TEST_ENV };
  const admin = createKnex(dbSettings(env, 'postgres'), { max: 1 });
  const dropOurs = async (filter: (pid: number) => boolean) => {
    const all = await admin.raw("SELECT datname FROM pg_database WHERE datname ~ '^(t|tpl)_[0-9]+(_|$)'");
    for (const { datname } of all.rows as { datname: string }[]) {
      const pid = Number(/^(?:t|tpl)_(\d+)/.exec(datname)![1]);
      if (filter(pid)) await admin.raw(`DROP DATABASE IF EXISTS "${datname}" WITH (FORCE)`);
    }
  };
  try {
    await dropOurs((pid) => !isAlive(pid));
    await admin.raw(`CREATE DATABASE ${TEMPLATE_DB}`);
  } catch (e) {
    await admin.destroy();
    throw e;
  }
  const tpl = createKnex(dbSettings(env, TEMPLATE_DB), { max: 1 });
  try {
    await migrateLatest(tpl);
  } finally {
    await tpl.destroy();
  }
  project.provide('testEnv', TEST_ENV);
  project.provide('testDbPrefix', `t_${RUN}_`);
  project.provide('templateDb', TEMPLATE_DB);

  return async () => {
    try {
      await dropOurs((pid) => pid === process.pid);
    } finally {
      await admin.destroy();
    }
  };
}

declare module 'vitest' {
  export interface ProvidedContext {
    testEnv: { PARALLAX_DATA_DIR: string; PARALLAX_DB_PORT: string };
    testDbPrefix: string;
    templateDb: string;
  }
}
