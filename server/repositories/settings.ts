import type { Knex } from 'knex';

export const settingsRepo = {
  async get<T>(db: Knex, key: string): Promise<T | null> {
    const r = await db('settings').where({ key }).first();
    return r ? (r.value as T) : null;
  },
  async put(db: Knex, key: string, value: unknown): Promise<void> {
    await db('settings')
      .insert({ key, value: JSON.stringify(value), updated_at: db.fn.now() })
      .onConflict('key')
      .merge();
  },
};
