// JSON endpoints the worker collects from, and the claim that lets several workers share them.
import type { Knex } from 'knex';
import type { CollectionTargetView } from '../../../shared/schemas/signals';

interface TargetRow {
  id: number;
  name: string;
  service_id: number;
  service: string;
  url: string;
  interval_seconds: number;
  counter_keys: string[];
  labels: Record<string, string>;
  prefix: string;
  enabled: boolean;
  next_run_at: Date;
  last_run_at: Date | null;
  last_error: string | null;
  last_sample_count: number | null;
  created_at: Date;
  updated_at: Date;
}

export interface TargetWrite {
  name: string;
  serviceId: number;
  url: string;
  intervalSeconds: number;
  counterKeys: string[];
  labels: Record<string, string>;
  prefix: string;
  enabled: boolean;
}

function toView(r: TargetRow): CollectionTargetView {
  return {
    id: r.id,
    name: r.name,
    service: r.service,
    url: r.url,
    intervalSeconds: r.interval_seconds,
    counterKeys: r.counter_keys,
    labels: r.labels,
    prefix: r.prefix,
    enabled: r.enabled,
    nextRunAt: r.next_run_at.toISOString(),
    lastRunAt: r.last_run_at?.toISOString() ?? null,
    lastError: r.last_error,
    lastSampleCount: r.last_sample_count,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

function toRow(t: Partial<TargetWrite>): Record<string, unknown> {
  const row: Record<string, unknown> = {};
  if (t.name !== undefined) row.name = t.name;
  if (t.serviceId !== undefined) row.service_id = t.serviceId;
  if (t.url !== undefined) row.url = t.url;
  if (t.intervalSeconds !== undefined) row.interval_seconds = t.intervalSeconds;
  if (t.counterKeys !== undefined) row.counter_keys = t.counterKeys;
  if (t.labels !== undefined) row.labels = JSON.stringify(t.labels);
  if (t.prefix !== undefined) row.prefix = t.prefix;
  if (t.enabled !== undefined) row.enabled = t.enabled;
  return row;
}

const base = (db: Knex) => db('collection_targets as c').join('services as s', 's.id', 'c.service_id').select('c.*', 's.name as service');

export const collectionTargetsRepo = {
  async list(db: Knex): Promise<CollectionTargetView[]> {
    return ((await base(db).orderBy('c.name')) as TargetRow[]).map(toView);
  },
  async byId(db: Knex, id: number): Promise<CollectionTargetView | null> {
    const r = (await base(db).where('c.id', id).first()) as TargetRow | undefined;
    return r ? toView(r) : null;
  },
  /** Null when the name is taken. */
  async insert(db: Knex, t: TargetWrite, createdBy: number | null): Promise<number | null> {
    const rows = await db('collection_targets').insert({ ...toRow(t), created_by: createdBy }).onConflict('name').ignore().returning('id');
    return rows.length ? (rows[0] as { id: number }).id : null;
  },
  /** 'missing' when there is no such target, 'conflict' when the new name is taken. */
  async update(db: Knex, id: number, patch: Partial<TargetWrite>): Promise<'ok' | 'missing' | 'conflict'> {
    try {
      const n = await db('collection_targets').where({ id }).update({ ...toRow(patch), updated_at: db.fn.now() });
      return n > 0 ? 'ok' : 'missing';
    } catch (e) {
      if ((e as { code?: string }).code === '23505') return 'conflict';
      throw e;
    }
  },
  async remove(db: Knex, id: number): Promise<boolean> {
    return (await db('collection_targets').where({ id }).delete()) > 0;
  },
  /**
   * Claims enabled targets that are due: moves each one's next run one interval on and returns
   * the slot it claimed. SKIP LOCKED lets several workers claim at once without taking the same
   * target twice.
   */
  async claimDue(db: Knex, nowMs: number, limit: number): Promise<Array<CollectionTargetView & { slotMs: number }>> {
    const rows = (
      await db.raw(
        `WITH due AS (
           SELECT id, next_run_at FROM collection_targets
           WHERE enabled AND next_run_at <= to_timestamp(? / 1000.0)
           ORDER BY next_run_at LIMIT ? FOR UPDATE SKIP LOCKED
         )
         UPDATE collection_targets c
         SET next_run_at = greatest(due.next_run_at + make_interval(secs => c.interval_seconds), to_timestamp(? / 1000.0))
         FROM due WHERE c.id = due.id
         RETURNING c.id, extract(epoch FROM due.next_run_at) * 1000 AS slot_ms`,
        [nowMs, limit, nowMs],
      )
    ).rows as { id: number; slot_ms: string }[];
    const out = [];
    for (const r of rows) {
      const t = await this.byId(db, r.id);
      if (t) out.push({ ...t, slotMs: Number(r.slot_ms) });
    }
    return out;
  },
  async recordRun(db: Knex, id: number, run: { at: Date; error: string | null; sampleCount: number | null }): Promise<void> {
    await db('collection_targets').where({ id }).update({ last_run_at: run.at, last_error: run.error, last_sample_count: run.sampleCount });
  },
};
