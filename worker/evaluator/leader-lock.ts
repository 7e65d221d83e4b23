// One evaluator leader among all workers: a session-level PostgreSQL advisory lock held on a
// connection of its own (as the scheduler does). Losing the connection loses the lock; the next
// attempt reconnects and competes again.
import type { Knex } from 'knex';
import pg from 'pg';

export function advisoryLeader(db: Knex, lockKey: number, log: (m: string) => void) {
  // The same database the Knex pool talks to (createKnex passes the settings as an object).
  const connection = (db.client as { config: Knex.Config }).config.connection as pg.ClientConfig;
  let client: pg.Client | null = null;
  let leading = false;

  return {
    isLeader: () => leading,
    async tryLead(): Promise<boolean> {
      if (leading && client) return true;
      if (!client) {
        const c = new pg.Client(connection);
        c.on('error', () => {
          leading = false;
          if (client === c) client = null;
        });
        await c.connect();
        client = c;
      }
      const r = await client.query('SELECT pg_try_advisory_lock($1) AS ok', [lockKey]);
      const was = leading;
      leading = r.rows[0].ok === true;
      if (leading && !was) log('leading');
      return leading;
    },
    async release(): Promise<void> {
      const c = client;
      client = null;
      leading = false;
      if (c) await c.end().catch(() => {});
    },
  };
}
