// `npm run migrate`: create the database if needed and apply every pending migration.
import { dbSettings } from '../server/config';
import { createKnex, migrateLatest } from '../server/db/knex';

export async function ensureDatabase(env: NodeJS.ProcessEnv = process.env): Promise<void> {
  const name = dbSettings(env).database;
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`PARALLAX_DB_NAME must be a plain identifier, got ${name}`);
  const admin = createKnex(dbSettings(env, 'postgres'), { max: 1 });
  try {
    const r = await admin.raw('SELECT 1 FROM pg_database WHERE datname = ?', [name]);
    if (r.rowCount === 0) await admin.raw(`CREATE DATABASE ${name}`);
  } finally {
    await admin.destroy();
  }
}

export async function migrate(env: NodeJS.ProcessEnv = process.env): Promise<string[]> {
  await ensureDatabase(env);
  const db = createKnex(dbSettings(env), { max: 1 });
  try {
    return await migrateLatest(db);
  } finally {
    await db.destroy();
  }
}

if (require.main === module) {
  migrate().then(
    (applied) => console.log(applied.length ? `[db] applied ${applied.length} migration(s): ${applied.join(', ')}` : '[db] schema is up to date'),
    (e: Error) => {
      console.error('[db] migration failed:', e.message);
      process.exit(1);
    },
  );
}
