import type { Knex } from 'knex';
import type { Principal } from '../auth/principal';
import { principalLabel } from '../auth/principal';

export interface AuditInput {
  action: string;
  subjectType: string;
  subjectId?: string | number | null;
  detail?: Record<string, unknown>;
}

export interface AuditEventView {
  id: number;
  at: string;
  actorType: 'user' | 'token' | 'system';
  actorLabel: string;
  action: string;
  subjectType: string;
  subjectId: string | null;
  detail: Record<string, unknown>;
}

export const auditRepo = {
  /** Call inside the transaction that makes the change, so the change and its record land together. */
  async record(db: Knex, actor: Principal | 'system', e: AuditInput): Promise<void> {
    await db('audit_events').insert({
      actor_type: actor === 'system' ? 'system' : actor.type,
      actor_id: actor === 'system' ? null : actor.id,
      actor_label: actor === 'system' ? 'system' : principalLabel(actor),
      action: e.action,
      subject_type: e.subjectType,
      subject_id: e.subjectId == null ? null : String(e.subjectId),
      detail: JSON.stringify(e.detail ?? {}),
    });
  },
  async page(db: Knex, limit: number, beforeId?: number): Promise<AuditEventView[]> {
    const q = db('audit_events').orderBy('id', 'desc').limit(limit);
    if (beforeId) q.where('id', '<', beforeId);
    const rows = await q;
    return rows.map((r) => ({
      id: r.id,
      at: r.at.toISOString(),
      actorType: r.actor_type,
      actorLabel: r.actor_label,
      action: r.action,
      subjectType: r.subject_type,
      subjectId: r.subject_id,
      detail: r.detail,
    }));
  },
};
