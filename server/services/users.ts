import type { Knex } from 'knex';
import type { CreateUserInput, UpdateUserInput, UserView } from '../../shared/schemas/users';
import type { Principal } from '../auth/principal';
import { hashPassword, randomPassword } from '../auth/passwords';
import { ConflictError, NotFoundError, ValidationError } from '../errors';
import { auditRepo } from '../repositories/audit';
import { toView, usersRepo } from '../repositories/users';

const UNIQUE_VIOLATION = '23505';

export function usersService(db: Knex) {
  return {
    async list(): Promise<UserView[]> {
      return (await usersRepo.list(db)).map(toView);
    },

    async create(actor: Principal, input: CreateUserInput): Promise<UserView> {
      const passwordHash = await hashPassword(input.password);
      try {
        return await db.transaction(async (tx) => {
          const u = await usersRepo.insert(tx, { ...input, passwordHash });
          await auditRepo.record(tx, actor, {
            action: 'user.create',
            subjectType: 'user',
            subjectId: u.id,
            detail: { email: u.email, role: u.role },
          });
          return toView(u);
        });
      } catch (e) {
        if ((e as { code?: string }).code === UNIQUE_VIOLATION)
          throw new ConflictError('A person with this email already exists', 'email');
        throw e;
      }
    },

    async update(actor: Principal, id: number, patch: UpdateUserInput): Promise<UserView> {
      return db.transaction(async (tx) => {
        // Serialise admin changes so two requests cannot both remove "the last admin".
        await tx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', ['users.admins']);
        const before = await usersRepo.byId(tx, id);
        if (!before) throw new NotFoundError('Person');
        if (actor.type === 'user' && actor.id === id && patch.disabled === true) {
          throw new ValidationError('You cannot disable your own account; ask another admin', 'disabled');
        }
        const losesAdmin =
          before.role === 'admin' && !before.disabled && ((patch.role && patch.role !== 'admin') || patch.disabled === true);
        if (losesAdmin && (await usersRepo.countActiveAdmins(tx)) <= 1) {
          throw new ValidationError('Parallax needs at least one active admin', patch.role ? 'role' : 'disabled');
        }
        const after = await usersRepo.update(tx, id, patch);
        await auditRepo.record(tx, actor, {
          action: 'user.update',
          subjectType: 'user',
          subjectId: id,
          detail: { before: { role: before.role, disabled: before.disabled }, after: patch },
        });
        if (patch.disabled) {
          // A disabled person is signed out everywhere at once.
          await tx.raw("DELETE FROM sessions WHERE (sess->'passport'->>'user')::text = ?", [String(id)]);
        }
        return toView(after!);
      });
    },

    /**
     * First run: when nobody exists, make an admin. The password comes from the environment or is
     * random and returned once so the start command can print it; nothing is hard-coded.
     */
    async bootstrapAdmin(env: { email?: string; password?: string }): Promise<{ email: string; password: string } | null> {
      return db.transaction(async (tx) => {
        await tx.raw('SELECT pg_advisory_xact_lock(hashtext(?))', ['users.bootstrap']);
        if ((await usersRepo.count(tx)) > 0) return null;
        const email = (env.email ?? 'admin@parallax.localhost').toLowerCase();
        const password = env.password ?? randomPassword();
        const u = await usersRepo.insert(tx, { email, name: 'First admin', role: 'admin', passwordHash: await hashPassword(password) });
        await auditRepo.record(tx, 'system', { action: 'user.bootstrap', subjectType: 'user', subjectId: u.id, detail: { email } });
        return { email, password };
      });
    },
  };
}
