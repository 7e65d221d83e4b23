// pg-boss writes its job rows with its own pool unless a send is given `db`: this adapter runs
// pg-boss's SQL on a Knex transaction, so a job is queued in the same transaction as the write
// that causes it (CONVENTIONS.md rule 11) and disappears with it on rollback.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';

export function knexExecutor(tx: Knex): PgBoss.Db {
  return {
    async executeSql(text: string, values: unknown[] = []) {
      // pg-boss numbers its parameters ($1, $2, and reuses them); Knex binds "?" in order.
      if (text.includes('?')) throw new Error('pg-boss statement contains "?", which Knex would take for a binding');
      const ordered: unknown[] = [];
      const sql = text.replace(/\$(\d+)/g, (_m, n: string) => {
        const v = values[Number(n) - 1];
        ordered.push(v === undefined ? null : v);
        return '?';
      });
      const res = await tx.raw(sql, ordered as Knex.RawBinding[]);
      return { rows: res.rows as unknown[] as never[] };
    },
  };
}
