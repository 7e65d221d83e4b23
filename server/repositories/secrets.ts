import type { Knex } from 'knex';
import type { Sealed } from '../secrets/cipher';

export interface SecretMeta {
  name: string;
  createdAt: string;
  updatedAt: string;
}

export const secretsRepo = {
  async list(db: Knex): Promise<SecretMeta[]> {
    const rows = await db('secrets').select('name', 'created_at', 'updated_at').orderBy('name');
    return rows.map((r) => ({ name: r.name, createdAt: r.created_at.toISOString(), updatedAt: r.updated_at.toISOString() }));
  },
  async upsert(db: Knex, name: string, s: Sealed, createdBy: number | null): Promise<'created' | 'updated'> {
    const [r] = await db('secrets')
      .insert({ name, iv: s.iv, ciphertext: s.ciphertext, tag: s.tag, created_by: createdBy })
      .onConflict('name')
      .merge({ iv: s.iv, ciphertext: s.ciphertext, tag: s.tag, updated_at: db.fn.now() })
      .returning(db.raw('(xmax = 0) AS inserted'));
    return (r as { inserted: boolean }).inserted ? 'created' : 'updated';
  },
  async remove(db: Knex, name: string): Promise<boolean> {
    return (await db('secrets').where({ name }).delete()) > 0;
  },
  async sealed(db: Knex, names: string[]): Promise<Map<string, Sealed>> {
    if (names.length === 0) return new Map();
    const rows = await db('secrets').whereIn('name', names);
    return new Map(rows.map((r) => [r.name as string, { iv: r.iv, ciphertext: r.ciphertext, tag: r.tag }]));
  },
};
