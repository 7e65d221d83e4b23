// Services, signals and series as the intake sees them: find-or-create in bulk, one statement per
// table whatever the batch size.
import type { Knex } from 'knex';
import type { SignalKind } from '../../../shared/schemas/signals';

export interface WantedSignal {
  service: string;
  name: string;
  kind: SignalKind;
  unit: string;
  description: string;
}

export interface ExistingSignal {
  id: number;
  serviceId: number;
  service: string;
  name: string;
  kind: SignalKind;
  unit: string;
}

export interface WantedSeries {
  signalId: number;
  labels: Record<string, string>;
  labelsHash: string;
}

export const seriesRepo = {
  /** Creates the services that do not exist yet; returns name → id for all of them. */
  async ensureServices(db: Knex, names: string[]): Promise<Map<string, number>> {
    await db.raw('INSERT INTO services (name) SELECT unnest(?::text[]) ON CONFLICT (name) DO NOTHING', [names]);
    const rows = (await db.raw('SELECT id, name FROM services WHERE name = ANY(?::text[])', [names])).rows as { id: number; name: string }[];
    return new Map(rows.map((r) => [r.name, r.id]));
  },

  /**
   * Creates missing signals with the kind and unit of their first sight and returns every wanted
   * signal as stored, so the caller can compare kinds (an existing signal keeps its kind).
   */
  async ensureSignals(db: Knex, serviceIds: Map<string, number>, wanted: WantedSignal[]): Promise<ExistingSignal[]> {
    const sid = wanted.map((w) => serviceIds.get(w.service)!);
    await db.raw(
      `INSERT INTO signals (service_id, name, kind, unit, description)
       SELECT * FROM unnest(?::bigint[], ?::text[], ?::text[], ?::text[], ?::text[])
       ON CONFLICT (service_id, name) DO NOTHING`,
      [sid, wanted.map((w) => w.name), wanted.map((w) => w.kind), wanted.map((w) => w.unit), wanted.map((w) => w.description)],
    );
    const rows = (
      await db.raw(
        `SELECT g.id, g.service_id, s.name AS service, g.name, g.kind, g.unit
         FROM signals g JOIN services s ON s.id = g.service_id
         JOIN unnest(?::bigint[], ?::text[]) AS w(service_id, name) ON w.service_id = g.service_id AND w.name = g.name`,
        [sid, wanted.map((w) => w.name)],
      )
    ).rows as { id: number; service_id: number; service: string; name: string; kind: SignalKind; unit: string }[];
    return rows.map((r) => ({ id: r.id, serviceId: r.service_id, service: r.service, name: r.name, kind: r.kind, unit: r.unit }));
  },

  /** Creates missing series; returns `${signalId}:${labelsHash}` → series id. */
  async ensureSeries(db: Knex, wanted: WantedSeries[]): Promise<Map<string, number>> {
    const signalIds = wanted.map((w) => w.signalId);
    const hashes = wanted.map((w) => w.labelsHash);
    await db.raw(
      `INSERT INTO series (signal_id, labels, labels_hash)
       SELECT * FROM unnest(?::bigint[], ?::jsonb[], ?::text[])
       ON CONFLICT (signal_id, labels_hash) DO NOTHING`,
      [signalIds, wanted.map((w) => JSON.stringify(w.labels)), hashes],
    );
    const rows = (
      await db.raw(
        `SELECT x.id, x.signal_id, x.labels_hash FROM series x
         JOIN unnest(?::bigint[], ?::text[]) AS w(signal_id, labels_hash) ON w.signal_id = x.signal_id AND w.labels_hash = x.labels_hash`,
        [signalIds, hashes],
      )
    ).rows as { id: number; signal_id: number; labels_hash: string }[];
    return new Map(rows.map((r) => [`${r.signal_id}:${r.labels_hash}`, r.id]));
  },

  /**
   * Records the newest sample time of series and of signals (ids distinct, times in ms). Rows
   * are locked in id order inside each statement, so two intakes touching overlapping rows
   * cannot deadlock.
   */
  async touchLastSample(db: Knex, table: 'series' | 'signals', ids: number[], times: number[]): Promise<void> {
    if (ids.length === 0) return;
    await db.raw(
      `WITH latest AS (
         SELECT id, to_timestamp(ms / 1000.0) AS t FROM unnest(?::bigint[], ?::float8[]) AS u(id, ms)
       ), locked AS (
         SELECT x.id FROM ${table} x JOIN latest l ON l.id = x.id
         WHERE x.last_sample_at IS NULL OR x.last_sample_at < l.t ORDER BY x.id FOR NO KEY UPDATE OF x
       )
       UPDATE ${table} x SET last_sample_at = l.t FROM latest l, locked k WHERE x.id = l.id AND k.id = l.id`,
      [ids, times],
    );
  },

  /** Locks series rows in id order (delta accumulation reads then extends their last point). */
  async lockSeries(db: Knex, ids: number[]): Promise<void> {
    if (ids.length === 0) return;
    await db.raw('SELECT id FROM series WHERE id = ANY(?::bigint[]) ORDER BY id FOR NO KEY UPDATE', [ids]);
  },
};
