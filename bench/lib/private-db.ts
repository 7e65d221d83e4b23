// A throwaway private PostgreSQL cluster for a benchmark run (its own data directory and port),
// migrated, and removed afterwards.
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Knex } from 'knex';
import { dbSettings, type DbSettings } from '../../server/config';
import { createKnex, migrateLatest } from '../../server/db/knex';
import { ensureDatabase } from '../../scripts/migrate';

const root = path.resolve(__dirname, '../..');

export interface PrivateDb {
  settings: DbSettings;
  knex: Knex;
  env: NodeJS.ProcessEnv;
  close(): Promise<void>;
}

export async function startPrivateDb(port: number): Promise<PrivateDb> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'px-bench-'));
  fs.chmodSync(dir, 0o755);
  const env = { ...process.env, PARALLAX_DATA_DIR: dir, PARALLAX_DB_PORT: String(port), PARALLAX_DB_MODE: 'normal', PARALLAX_DB_NAME: 'bench' };
  execFileSync('bash', [path.join(root, 'scripts/db.sh'), 'start'], { env, stdio: ['ignore', 'ignore', 'inherit'] });
  await ensureDatabase(env);
  const settings = dbSettings(env);
  const knex = createKnex(settings, { max: 20 });
  await migrateLatest(knex);
  return {
    settings,
    knex,
    env,
    async close() {
      await knex.destroy();
      execFileSync('bash', [path.join(root, 'scripts/db.sh'), 'stop'], { env, stdio: ['ignore', 'ignore', 'inherit'] });
      fs.rmSync(dir, { recursive: true, force: true });
      const pgdir = fs.existsSync(path.join(dir, 'pg-dir')) ? fs.readFileSync(path.join(dir, 'pg-dir'), 'utf8').trim() : null;
      if (pgdir && pgdir.startsWith('/tmp/')) fs.rmSync(pgdir, { recursive: true, force: true });
    },
  };
}

export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil(p * sorted.length) - 1));
  return sorted[i]!;
}
