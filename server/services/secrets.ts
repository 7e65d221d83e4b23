import type { Knex } from 'knex';
import type { Principal } from '../auth/principal';
import { NotFoundError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { secretsRepo } from '../repositories/secrets';
import { open, seal } from '../secrets/cipher';

export function secretsService(db: Knex, key: Buffer) {
  return {
    list: () => secretsRepo.list(db),

    async save(actor: Principal, name: string, value: string, tx: Knex = db): Promise<'created' | 'updated'> {
      const run = async (t: Knex) => {
        const outcome = await secretsRepo.upsert(t, name, seal(key, name, value), actor.type === 'user' ? actor.id : null);
        // The audit record names the secret, never its value.
        await auditRepo.record(t, actor, { action: `secret.${outcome === 'created' ? 'create' : 'update'}`, subjectType: 'secret', subjectId: name });
        return outcome;
      };
      return tx === db ? db.transaction(run) : run(tx);
    },

    async remove(actor: Principal, name: string) {
      await db.transaction(async (tx) => {
        if (!(await secretsRepo.remove(tx, name))) throw new NotFoundError('Secret');
        await auditRepo.record(tx, actor, { action: 'secret.delete', subjectType: 'secret', subjectId: name });
      });
    },

    /** Plain values for a run; only the prober calls this, and only for the names a journey uses. */
    async reveal(names: string[]): Promise<Record<string, string>> {
      const sealed = await secretsRepo.sealed(db, names);
      const out: Record<string, string> = {};
      for (const [name, s] of sealed) out[name] = open(key, name, s);
      return out;
    },
  };
}
