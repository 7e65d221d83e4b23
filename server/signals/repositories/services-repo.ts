// Services with their signal counts and newest sample, for the Services list and the intake.
import type { Knex } from 'knex';
import type { ServiceView } from '../../../shared/schemas/signals';

interface ServiceRow {
  id: number;
  name: string;
  description: string;
  owner: string;
  created_at: Date;
  signal_count: number | string;
  series_count: number | string;
  last_sample_at: Date | null;
}

function toView(r: ServiceRow): ServiceView {
  return {
    id: r.id,
    name: r.name,
    description: r.description,
    owner: r.owner,
    createdAt: r.created_at.toISOString(),
    signalCount: Number(r.signal_count),
    seriesCount: Number(r.series_count),
    lastSampleAt: r.last_sample_at?.toISOString() ?? null,
  };
}

const SELECT = `
  SELECT s.*, coalesce(g.signal_count, 0) AS signal_count, coalesce(g.series_count, 0) AS series_count, g.last_sample_at
  FROM services s
  LEFT JOIN (
    SELECT sg.service_id, count(*) AS signal_count, sum(sc.n) AS series_count, max(sg.last_sample_at) AS last_sample_at
    FROM signals sg LEFT JOIN (SELECT signal_id, count(*) AS n FROM series GROUP BY signal_id) sc ON sc.signal_id = sg.id
    GROUP BY sg.service_id
  ) g ON g.service_id = s.id`;

export const servicesRepo = {
  async list(db: Knex): Promise<ServiceView[]> {
    const rows = (await db.raw(`${SELECT} ORDER BY s.name`)).rows as ServiceRow[];
    return rows.map(toView);
  },
  async byId(db: Knex, id: number): Promise<ServiceView | null> {
    const r = (await db.raw(`${SELECT} WHERE s.id = ?`, [id])).rows[0] as ServiceRow | undefined;
    return r ? toView(r) : null;
  },
  async idByName(db: Knex, name: string): Promise<number | null> {
    const r = await db('services').where({ name }).first('id');
    return r ? (r.id as number) : null;
  },
  /** Returns null when the name is taken. */
  async insert(db: Knex, s: { name: string; description: string; owner: string }): Promise<number | null> {
    const rows = await db('services').insert(s).onConflict('name').ignore().returning('id');
    return rows.length ? (rows[0] as { id: number }).id : null;
  },
  async ensure(db: Knex, name: string): Promise<number> {
    await db('services').insert({ name }).onConflict('name').ignore();
    return (await db('services').where({ name }).first('id')).id as number;
  },
  async update(db: Knex, id: number, patch: { description?: string; owner?: string }): Promise<boolean> {
    return (await db('services').where({ id }).update(patch)) > 0;
  },
};
