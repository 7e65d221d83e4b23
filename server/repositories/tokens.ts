import type { Knex } from 'knex';
import type { TokenScope } from '../../shared/roles';
import type { TokenView } from '../../shared/schemas/tokens';

interface TokenRow {
  id: number;
  name: string;
  prefix: string;
  token_hash: string;
  scopes: TokenScope[];
  created_by: number | null;
  created_at: Date;
  last_used_at: Date | null;
  revoked_at: Date | null;
  created_by_email?: string | null;
}

function toView(r: TokenRow): TokenView {
  return {
    id: r.id,
    name: r.name,
    scopes: r.scopes,
    prefix: r.prefix,
    createdAt: r.created_at.toISOString(),
    createdBy: r.created_by_email ?? null,
    lastUsedAt: r.last_used_at?.toISOString() ?? null,
    revokedAt: r.revoked_at?.toISOString() ?? null,
  };
}

export const tokensRepo = {
  async list(db: Knex): Promise<TokenView[]> {
    const rows = await db<TokenRow>('api_tokens as t')
      .leftJoin('users as u', 'u.id', 't.created_by')
      .select('t.*', 'u.email as created_by_email')
      .orderBy('t.id', 'desc');
    return rows.map(toView);
  },
  async byId(db: Knex, id: number): Promise<TokenView | null> {
    const r = await db<TokenRow>('api_tokens as t')
      .leftJoin('users as u', 'u.id', 't.created_by')
      .select('t.*', 'u.email as created_by_email')
      .where('t.id', id)
      .first();
    return r ? toView(r) : null;
  },
  async insert(
    db: Knex,
    t: { name: string; prefix: string; tokenHash: string; scopes: TokenScope[]; createdBy: number | null },
  ): Promise<number> {
    const [r] = await db('api_tokens')
      .insert({ name: t.name, prefix: t.prefix, token_hash: t.tokenHash, scopes: t.scopes, created_by: t.createdBy })
      .returning('id');
    return (r as { id: number }).id;
  },
  async revoke(db: Knex, id: number): Promise<boolean> {
    const n = await db('api_tokens').where({ id }).whereNull('revoked_at').update({ revoked_at: db.fn.now() });
    return n > 0;
  },
  /** Finds a live token by its hash and records the use in the same statement. */
  async useByHash(db: Knex, tokenHash: string): Promise<{ id: number; name: string; scopes: TokenScope[] } | null> {
    const [r] = await db<TokenRow>('api_tokens')
      .where({ token_hash: tokenHash })
      .whereNull('revoked_at')
      .update({ last_used_at: db.fn.now() })
      .returning(['id', 'name', 'scopes']);
    return r ? { id: r.id, name: r.name, scopes: r.scopes } : null;
  },
};
