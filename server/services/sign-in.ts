import type { Knex } from 'knex';
import type { SessionUser } from '../../shared/api-types';
import { dummyPasswordHash, verifyPassword } from '../auth/passwords';
import { auditRepo } from '../repositories/audit';
import { usersRepo } from '../repositories/users';

/**
 * Checks an email and password. Unknown email, wrong password and disabled person all give null,
 * and all cost one scrypt verification, so neither the answer nor its timing tells them apart.
 */
export async function checkCredentials(db: Knex, email: string, password: string): Promise<SessionUser | null> {
  const u = await usersRepo.byEmail(db, email);
  const ok = await verifyPassword(password, u?.passwordHash ?? (await dummyPasswordHash()));
  if (!u || !ok || u.disabled) return null;
  await db.transaction(async (tx) => {
    await usersRepo.touchSignIn(tx, u.id);
    await auditRepo.record(tx, { type: 'user', id: u.id, email: u.email, name: u.name, role: u.role }, {
      action: 'session.sign_in',
      subjectType: 'user',
      subjectId: u.id,
    });
  });
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}

/** Loads the person behind a session; a disabled or deleted person has no session. */
export async function sessionUser(db: Knex, id: number): Promise<SessionUser | null> {
  const u = await usersRepo.byId(db, id);
  if (!u || u.disabled) return null;
  return { id: u.id, email: u.email, name: u.name, role: u.role };
}
