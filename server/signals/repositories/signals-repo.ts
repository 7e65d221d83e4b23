// Signals of a service with their label keys, for the signal explorer and the query API.
import type { Knex } from 'knex';
import type { SignalKind, SignalView } from '../../../shared/schemas/signals';

export interface SignalRecord {
  id: number;
  serviceId: number;
  name: string;
  kind: SignalKind;
  unit: string;
}

export const signalsRepo = {
  async listForService(db: Knex, serviceId: number, service: string): Promise<SignalView[]> {
    const rows = (
      await db.raw(
        `SELECT g.id, g.name, g.kind, g.unit, g.description, g.last_sample_at,
                (SELECT count(*) FROM series x WHERE x.signal_id = g.id) AS series_count,
                (SELECT coalesce(array_agg(DISTINCT k ORDER BY k), '{}') FROM series x, jsonb_object_keys(x.labels) k WHERE x.signal_id = g.id) AS label_keys
         FROM signals g WHERE g.service_id = ? ORDER BY g.name`,
        [serviceId],
      )
    ).rows as { id: number; name: string; kind: SignalKind; unit: string; description: string; last_sample_at: Date | null; series_count: string | number; label_keys: string[] }[];
    return rows.map((r) => ({
      id: r.id,
      service,
      name: r.name,
      kind: r.kind,
      unit: r.unit,
      description: r.description,
      labelKeys: r.label_keys,
      seriesCount: Number(r.series_count),
      lastSampleAt: r.last_sample_at?.toISOString() ?? null,
    }));
  },
  async byName(db: Knex, serviceId: number, name: string): Promise<SignalRecord | null> {
    const r = await db('signals').where({ service_id: serviceId, name }).first('id', 'service_id', 'name', 'kind', 'unit');
    return r ? { id: r.id, serviceId: r.service_id, name: r.name, kind: r.kind, unit: r.unit } : null;
  },
};
