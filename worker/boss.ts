import PgBoss from 'pg-boss';
import type { DbSettings } from '../server/config';

/** A pg-boss instance on our database; its tables live in their own schema. */
export async function startBoss(db: DbSettings, extra: Partial<PgBoss.ConstructorOptions> = {}): Promise<PgBoss> {
  const boss = new PgBoss({
    ...extra,
    host: db.host,
    port: db.port,
    user: db.user,
    password: db.password,
    database: db.database,
    schema: 'pgboss',
    max: 4,
  });
  boss.on('error', (e) => console.error('[worker] queue error:', e.message));
  await boss.start();
  return boss;
}
