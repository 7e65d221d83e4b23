// Alert rules in PostgreSQL. The document is the zod-validated rule; name, kind, service and
// enabled are also columns so lists and the evaluator can filter without opening documents.
import type { Knex } from 'knex';
import type { RuleDocument } from '../../../shared/rules/rule-schema';

export interface RuleRecord {
  id: number;
  name: string;
  kind: RuleDocument['kind'];
  serviceId: number;
  service: string;
  document: RuleDocument;
  enabled: boolean;
  version: number;
  createdAt: Date;
  updatedAt: Date;
  open: { pending: number; raised: number; noData: number };
}

export interface RuleWrite {
  name: string;
  kind: RuleDocument['kind'];
  serviceId: number;
  document: RuleDocument;
  enabled: boolean;
}

interface Row {
  id: number;
  name: string;
  kind: RuleDocument['kind'];
  service_id: number;
  service: string;
  document: RuleDocument;
  enabled: boolean;
  version: number;
  created_at: Date;
  updated_at: Date;
  pending?: number | null;
  raised?: number | null;
  no_data?: number | null;
}

function toRecord(r: Row): RuleRecord {
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    serviceId: r.service_id,
    service: r.service,
    // The enabled column is the truth (enable/disable touch only the column).
    document: { ...r.document, name: r.name, enabled: r.enabled },
    enabled: r.enabled,
    version: r.version,
    createdAt: r.created_at,
    updatedAt: r.updated_at,
    open: { pending: Number(r.pending ?? 0), raised: Number(r.raised ?? 0), noData: Number(r.no_data ?? 0) },
  };
}

// Open alerts per rule come from one grouped scan of the open-alert index, not a query per rule.
const SELECT = `
  SELECT r.id, r.name, r.kind, r.service_id, s.name AS service, r.document, r.enabled, r.version, r.created_at, r.updated_at,
         o.pending, o.raised, o.no_data
  FROM alert_rules r
  JOIN services s ON s.id = r.service_id
  LEFT JOIN (
    SELECT rule_id, count(*) FILTER (WHERE state = 'pending') AS pending, count(*) FILTER (WHERE state = 'raised') AS raised,
           count(*) FILTER (WHERE state = 'no_data') AS no_data
    FROM alerts WHERE state <> 'cleared' GROUP BY rule_id
  ) o ON o.rule_id = r.id
  WHERE r.deleted_at IS NULL`;

export const rulesRepo = {
  async list(db: Knex, filter: { service?: string; enabled?: boolean } = {}): Promise<RuleRecord[]> {
    const where: string[] = [];
    const args: Knex.RawBinding[] = [];
    if (filter.service !== undefined) {
      where.push('s.name = ?');
      args.push(filter.service);
    }
    if (filter.enabled !== undefined) {
      where.push('r.enabled = ?');
      args.push(filter.enabled);
    }
    const rows = (await db.raw(`${SELECT}${where.map((w) => ` AND ${w}`).join('')} ORDER BY r.name, r.id`, args)).rows as Row[];
    return rows.map(toRecord);
  },

  async byId(db: Knex, id: number): Promise<RuleRecord | null> {
    const r = (await db.raw(`${SELECT} AND r.id = ?`, [id])).rows[0] as Row | undefined;
    return r ? toRecord(r) : null;
  },

  /** Locks the rule row for the rest of the transaction (edits wait for an evaluator cycle's writes). */
  async lock(db: Knex, id: number): Promise<{ version: number; enabled: boolean } | null> {
    const r = await db('alert_rules').where({ id }).whereNull('deleted_at').forUpdate().first('version', 'enabled');
    return r ? { version: r.version, enabled: r.enabled } : null;
  },

  async insert(db: Knex, w: RuleWrite, by: number | null): Promise<number> {
    const [row] = await db('alert_rules')
      .insert({ name: w.name, kind: w.kind, service_id: w.serviceId, document: JSON.stringify(w.document), enabled: w.enabled, created_by: by, updated_by: by })
      .returning('id');
    return (row as { id: number }).id;
  },

  /** Replaces the document; `bumpVersion` when the condition changed (the evaluator drops stale writes). */
  async update(db: Knex, id: number, w: RuleWrite, by: number | null, bumpVersion: boolean): Promise<void> {
    await db('alert_rules')
      .where({ id })
      .update({
        name: w.name,
        kind: w.kind,
        service_id: w.serviceId,
        document: JSON.stringify(w.document),
        enabled: w.enabled,
        updated_by: by,
        updated_at: db.fn.now(),
        version: bumpVersion ? db.raw('version + 1') : db.raw('version'),
      });
  },

  async setEnabled(db: Knex, id: number, enabled: boolean, by: number | null): Promise<void> {
    await db('alert_rules').where({ id }).update({ enabled, updated_by: by, updated_at: db.fn.now(), version: db.raw('version + 1') });
  },

  async softDelete(db: Knex, id: number, by: number | null): Promise<void> {
    await db('alert_rules').where({ id }).update({ deleted_at: db.fn.now(), enabled: false, updated_by: by, version: db.raw('version + 1') });
  },

  /** Names of live rules that send to a channel (a channel in use cannot be deleted). */
  async namesUsingChannel(db: Knex, channelId: number): Promise<string[]> {
    return db('alert_rules')
      .whereNull('deleted_at')
      .whereRaw("document->'channelIds' @> ?::jsonb", [JSON.stringify([channelId])])
      .orderBy('name')
      .pluck('name');
  },

  /** A free "<name> (copy)", "<name> (copy 2)"... for duplicates. */
  async freeCopyName(db: Knex, name: string): Promise<string> {
    const base = `${name.slice(0, 190)} (copy`;
    const taken = new Set<string>(await db('alert_rules').whereNull('deleted_at').where('name', 'like', `${base.replace(/[\\%_]/g, '\\$&')}%`).pluck('name'));
    if (!taken.has(`${base})`)) return `${base})`;
    for (let i = 2; ; i++) if (!taken.has(`${base} ${i})`)) return `${base} ${i})`;
  },
};
