import type { Knex } from 'knex';

export interface VantageRow {
  name: string;
  region: string;
  createdAt: string;
  lastBeatAt: Date | null;
  beatSeconds: number | null;
}

export const vantagesRepo = {
  async list(db: Knex): Promise<VantageRow[]> {
    const rows = await db('vantages as v')
      .leftJoin('worker_heartbeats as h', 'h.name', 'v.name')
      .select('v.name', 'v.region', 'v.created_at', 'h.last_beat_at', 'h.beat_seconds')
      .orderBy('v.name');
    return rows.map((r) => ({
      name: r.name,
      region: r.region,
      createdAt: r.created_at.toISOString(),
      lastBeatAt: r.last_beat_at ?? null,
      beatSeconds: r.beat_seconds ?? null,
    }));
  },
  async upsert(db: Knex, name: string, region: string): Promise<void> {
    await db('vantages').insert({ name, region }).onConflict('name').merge({ region });
  },
  async remove(db: Knex, name: string): Promise<boolean> {
    return (await db('vantages').where({ name }).delete()) > 0;
  },
  async names(db: Knex): Promise<string[]> {
    return (await db('vantages').select('name')).map((r) => r.name as string);
  },
};
