import type { Knex } from 'knex';
import type { JourneyDocument } from '../../shared/journey/journey-schema';

export interface JourneyRecord {
  id: number;
  name: string;
  version: number;
  enabled: boolean;
  document: JourneyDocument;
  serviceIds: number[];
  createdAt: string;
  updatedAt: string;
}

export const journeysRepo = {
  /** Current version of every journey (or the enabled ones), one query. */
  async listCurrent(db: Knex, opts: { enabledOnly?: boolean } = {}): Promise<JourneyRecord[]> {
    const q = db('journeys as j')
      .join('journey_versions as v', function () {
        this.on('v.journey_id', 'j.id').andOn('v.version', 'j.current_version');
      })
      .select('j.*', 'v.document')
      .select(db.raw('coalesce((SELECT array_agg(service_id ORDER BY service_id) FROM journey_services s WHERE s.journey_id = j.id), ARRAY[]::bigint[]) AS service_ids'))
      .orderBy('j.name');
    if (opts.enabledOnly) q.where('j.enabled', true);
    const rows = await q;
    return rows.map(toRecord);
  },
  async byId(db: Knex, id: number, version?: number): Promise<JourneyRecord | null> {
    const r = await db('journeys as j')
      .join('journey_versions as v', function () {
        this.on('v.journey_id', 'j.id');
        if (version === undefined) this.andOn('v.version', 'j.current_version');
      })
      .modify((q) => {
        if (version !== undefined) q.where('v.version', version);
      })
      .where('j.id', id)
      .select('j.*', 'v.document', 'v.version as doc_version')
      .select(db.raw('coalesce((SELECT array_agg(service_id ORDER BY service_id) FROM journey_services s WHERE s.journey_id = j.id), ARRAY[]::bigint[]) AS service_ids'))
      .first();
    return r ? { ...toRecord(r), version: r.doc_version } : null;
  },
  async insert(db: Knex, doc: JourneyDocument, createdBy: number | null): Promise<number> {
    const [j] = await db('journeys').insert({ name: doc.name, current_version: 1, enabled: doc.enabled }).returning('id');
    const id = (j as { id: number }).id;
    await db('journey_versions').insert({ journey_id: id, version: 1, document: JSON.stringify(doc), created_by: createdBy });
    return id;
  },
  /** Adds a version and makes it current; the row lock serialises concurrent saves. */
  async addVersion(db: Knex, id: number, doc: JourneyDocument, createdBy: number | null): Promise<number | null> {
    const cur = await db('journeys').where({ id }).forUpdate().first();
    if (!cur) return null;
    const version = cur.current_version + 1;
    await db('journey_versions').insert({ journey_id: id, version, document: JSON.stringify(doc), created_by: createdBy });
    await db('journeys').where({ id }).update({ name: doc.name, enabled: doc.enabled, current_version: version, updated_at: db.fn.now() });
    return version;
  },
  async setServices(db: Knex, id: number, serviceIds: number[]): Promise<void> {
    await db('journey_services').where({ journey_id: id }).delete();
    if (serviceIds.length) await db('journey_services').insert(serviceIds.map((s) => ({ journey_id: id, service_id: s })));
  },
  async versions(db: Knex, id: number): Promise<{ version: number; createdAt: string; createdBy: string | null }[]> {
    const rows = await db('journey_versions as v')
      .leftJoin('users as u', 'u.id', 'v.created_by')
      .where('v.journey_id', id)
      .select('v.version', 'v.created_at', 'u.email')
      .orderBy('v.version', 'desc');
    return rows.map((r) => ({ version: r.version, createdAt: r.created_at.toISOString(), createdBy: r.email ?? null }));
  },
  async remove(db: Knex, id: number): Promise<boolean> {
    return (await db('journeys').where({ id }).delete()) > 0;
  },
};

function toRecord(r: Record<string, any>): JourneyRecord {
  return {
    id: r.id,
    name: r.name,
    version: r.current_version,
    enabled: r.enabled,
    document: r.document,
    serviceIds: (r.service_ids ?? []).map(Number),
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}
