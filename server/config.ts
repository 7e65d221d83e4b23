// Settings from the environment, so two instances can run side by side on one machine.
import fs from 'node:fs';
import path from 'node:path';

export interface DbSettings {
  host: string;
  port: number;
  user: string;
  password: string;
  database: string;
}

export const repoRoot = path.resolve(__dirname, '..');

export function dataDir(env: NodeJS.ProcessEnv = process.env): string {
  return path.resolve(env.PARALLAX_DATA_DIR ?? path.join(repoRoot, '.data'));
}

export function dbPort(env: NodeJS.ProcessEnv = process.env): number {
  return Number(env.PARALLAX_DB_PORT ?? 54329);
}

/** The cluster's superuser password is made by scripts/db.sh at first start; never a fixed value. */
export function dbPassword(env: NodeJS.ProcessEnv = process.env): string {
  const file = path.join(dataDir(env), 'db-password');
  try {
    return fs.readFileSync(file, 'utf8').trim();
  } catch {
    throw new Error(`No database password at ${file}: start the database first (npm run db:start)`);
  }
}

export function dbSettings(env: NodeJS.ProcessEnv = process.env, database = env.PARALLAX_DB_NAME ?? 'parallax'): DbSettings {
  return { host: '127.0.0.1', port: dbPort(env), user: 'postgres', password: dbPassword(env), database };
}

export function httpPort(env: NodeJS.ProcessEnv = process.env): number {
  return Number(env.PORT ?? 8080);
}
