// Maintenance windows per service.
import type { Knex } from 'knex';
import type { MaintenanceWindowView } from '../../../shared/rules/api-schemas';

interface Row {
  id: number;
  service: string;
  starts_at: Date;
  ends_at: Date;
  reason: string;
  created_by_email: string | null;
  created_at: Date;
}

const SELECT = `
  SELECT w.id, s.name AS service, w.starts_at, w.ends_at, w.reason, u.email AS created_by_email, w.created_at
  FROM maintenance_windows w JOIN services s ON s.id = w.service_id LEFT JOIN users u ON u.id = w.created_by`;

function toView(r: Row, now: Date): MaintenanceWindowView {
  return {
    id: r.id,
    service: r.service,
    startsAt: r.starts_at.toISOString(),
    endsAt: r.ends_at.toISOString(),
    reason: r.reason,
    active: r.starts_at <= now && now < r.ends_at,
    createdBy: r.created_by_email,
    createdAt: r.created_at.toISOString(),
  };
}

export const maintenanceRepo = {
  async list(db: Knex, now: Date, filter: { service?: string; current?: boolean } = {}): Promise<MaintenanceWindowView[]> {
    const where: string[] = [];
    const args: Knex.RawBinding[] = [];
    if (filter.service !== undefined) {
      where.push('s.name = ?');
      args.push(filter.service);
    }
    if (filter.current) {
      where.push('w.ends_at > ?');
      args.push(now);
    }
    const sql = `${SELECT}${where.length ? ` WHERE ${where.join(' AND ')}` : ''} ORDER BY w.starts_at DESC, w.id DESC LIMIT 500`;
    return ((await db.raw(sql, args)).rows as Row[]).map((r) => toView(r, now));
  },

  async byId(db: Knex, id: number, now: Date): Promise<MaintenanceWindowView | null> {
    const r = (await db.raw(`${SELECT} WHERE w.id = ?`, [id])).rows[0] as Row | undefined;
    return r ? toView(r, now) : null;
  },

  async insert(db: Knex, w: { serviceId: number; startsAt: Date; endsAt: Date; reason: string }, by: number | null): Promise<number> {
    const [row] = await db('maintenance_windows')
      .insert({ service_id: w.serviceId, starts_at: w.startsAt, ends_at: w.endsAt, reason: w.reason, created_by: by })
      .returning('id');
    return (row as { id: number }).id;
  },

  async update(db: Knex, id: number, patch: { startsAt?: Date; endsAt?: Date; reason?: string }): Promise<boolean> {
    const set: Record<string, unknown> = { updated_at: db.fn.now() };
    if (patch.startsAt) set.starts_at = patch.startsAt;
    if (patch.endsAt) set.ends_at = patch.endsAt;
    if (patch.reason !== undefined) set.reason = patch.reason;
    return (await db('maintenance_windows').where({ id }).update(set)) > 0;
  },

  async remove(db: Knex, id: number): Promise<boolean> {
    return (await db('maintenance_windows').where({ id }).del()) > 0;
  },

  /** Services with a window open at `at`. */
  async activeServiceIds(db: Knex, at: Date): Promise<Set<number>> {
    const ids: number[] = await db('maintenance_windows').where('starts_at', '<=', at).andWhere('ends_at', '>', at).distinct().pluck('service_id');
    return new Set(ids);
  },
};
