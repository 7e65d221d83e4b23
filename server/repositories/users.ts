import type { Knex } from 'knex';
import type { Role } from '../../shared/roles';
import type { UserView } from '../../shared/schemas/users';

interface UserRow {
  id: number;
  email: string;
  name: string;
  role: Role;
  password_hash: string;
  disabled_at: Date | null;
  created_at: Date;
  last_sign_in_at: Date | null;
}

export interface UserRecord extends UserView {
  passwordHash: string;
}

function toRecord(r: UserRow): UserRecord {
  return {
    id: r.id,
    email: r.email,
    name: r.name,
    role: r.role,
    disabled: r.disabled_at !== null,
    createdAt: r.created_at.toISOString(),
    lastSignInAt: r.last_sign_in_at?.toISOString() ?? null,
    passwordHash: r.password_hash,
  };
}

export function toView(u: UserRecord): UserView {
  const { passwordHash: _omit, ...view } = u;
  return view;
}

export const usersRepo = {
  async count(db: Knex): Promise<number> {
    const row = await db('users').count<{ count: number }>({ count: '*' }).first();
    return Number(row?.count ?? 0);
  },
  async list(db: Knex): Promise<UserRecord[]> {
    return (await db<UserRow>('users').orderBy('id')).map(toRecord);
  },
  async byId(db: Knex, id: number): Promise<UserRecord | null> {
    const r = await db<UserRow>('users').where({ id }).first();
    return r ? toRecord(r) : null;
  },
  async byEmail(db: Knex, email: string): Promise<UserRecord | null> {
    const r = await db<UserRow>('users').where({ email: email.toLowerCase() }).first();
    return r ? toRecord(r) : null;
  },
  async insert(db: Knex, u: { email: string; name: string; role: Role; passwordHash: string }): Promise<UserRecord> {
    const [r] = await db<UserRow>('users')
      .insert({ email: u.email.toLowerCase(), name: u.name, role: u.role, password_hash: u.passwordHash })
      .returning('*');
    return toRecord(r!);
  },
  async update(db: Knex, id: number, patch: { role?: Role; disabled?: boolean }): Promise<UserRecord | null> {
    const set: Record<string, unknown> = {};
    if (patch.role !== undefined) set.role = patch.role;
    if (patch.disabled !== undefined) set.disabled_at = patch.disabled ? db.fn.now() : null;
    const [r] = await db<UserRow>('users').where({ id }).update(set as Partial<UserRow>).returning('*');
    return r ? toRecord(r) : null;
  },
  async countActiveAdmins(db: Knex): Promise<number> {
    const row = await db('users').where({ role: 'admin' }).whereNull('disabled_at').count<{ count: number }>({ count: '*' }).first();
    return Number(row?.count ?? 0);
  },
  async touchSignIn(db: Knex, id: number): Promise<void> {
    await db('users').where({ id }).update({ last_sign_in_at: db.fn.now() });
  },
};
