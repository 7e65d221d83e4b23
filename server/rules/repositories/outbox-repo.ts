// The notification outbox: rows written with the state change that causes them, delivered by the
// notifier. Delivery locks its row, sends, and marks it sent before the lock is released, so a
// retried (or duplicated) job finds it sent and sends nothing.
import type { Knex } from 'knex';
import type { NotificationPayload } from '../notification-payload';

export type OutboxChannel = 'mail' | 'webhook';

export interface OutboxInsert {
  alertId: number;
  ruleId: number;
  transition: string;
  channel: OutboxChannel;
  channelId: number | null;
  recipients: string[];
  payload: NotificationPayload;
}

export interface OutboxRow {
  id: number;
  alertId: number;
  ruleId: number;
  transition: string;
  channel: OutboxChannel;
  channelId: number | null;
  recipients: string[];
  payload: NotificationPayload;
  status: 'pending' | 'sent' | 'failed';
  attempts: number;
  lastError: string | null;
  createdAt: Date;
  sentAt: Date | null;
}

interface Row {
  id: number;
  alert_id: number;
  rule_id: number;
  transition: string;
  channel: OutboxChannel;
  channel_id: number | null;
  recipients: string[];
  payload: NotificationPayload;
  status: OutboxRow['status'];
  attempts: number;
  last_error: string | null;
  created_at: Date;
  sent_at: Date | null;
}

function toRow(r: Row): OutboxRow {
  return {
    id: r.id,
    alertId: r.alert_id,
    ruleId: r.rule_id,
    transition: r.transition,
    channel: r.channel,
    channelId: r.channel_id,
    recipients: r.recipients,
    payload: r.payload,
    status: r.status,
    attempts: r.attempts,
    lastError: r.last_error,
    createdAt: r.created_at,
    sentAt: r.sent_at,
  };
}

export const outboxRepo = {
  /** Returns the new rows' ids (in no particular order). */
  async insert(db: Knex, rows: OutboxInsert[]): Promise<number[]> {
    if (rows.length === 0) return [];
    const res = await db.raw(
      `INSERT INTO notification_outbox (alert_id, rule_id, transition, channel, channel_id, recipients, payload)
       SELECT alert_id, rule_id, transition, channel, channel_id, ARRAY(SELECT jsonb_array_elements_text(recipients)), payload
       FROM jsonb_to_recordset(?::jsonb) AS x(alert_id bigint, rule_id bigint, transition text, channel text, channel_id bigint, recipients jsonb, payload jsonb)
       RETURNING id`,
      [
        JSON.stringify(
          rows.map((r) => ({ alert_id: r.alertId, rule_id: r.ruleId, transition: r.transition, channel: r.channel, channel_id: r.channelId, recipients: r.recipients, payload: r.payload })),
        ),
      ],
    );
    return (res.rows as { id: number }[]).map((r) => r.id);
  },

  /** Locks the row until the transaction ends (call inside the delivery transaction). */
  async lockForDelivery(tx: Knex, id: number): Promise<OutboxRow | null> {
    const r = (await tx('notification_outbox').where({ id }).forUpdate().first()) as Row | undefined;
    return r ? toRow(r) : null;
  },

  async markSent(tx: Knex, id: number, at: Date): Promise<void> {
    await tx('notification_outbox').where({ id }).update({ status: 'sent', sent_at: at, attempts: tx.raw('attempts + 1'), last_error: null });
  },

  /** A failed attempt; `final` when no retry is left. Never touches a row already sent. */
  async recordFailure(db: Knex, id: number, error: string, final: boolean): Promise<void> {
    await db('notification_outbox')
      .where({ id })
      .whereNot('status', 'sent')
      .update({ attempts: db.raw('attempts + 1'), last_error: error.slice(0, 2000), status: final ? 'failed' : 'pending' });
  },

  async byId(db: Knex, id: number): Promise<OutboxRow | null> {
    const r = (await db('notification_outbox').where({ id }).first()) as Row | undefined;
    return r ? toRow(r) : null;
  },

  async forAlert(db: Knex, alertId: number): Promise<OutboxRow[]> {
    return ((await db('notification_outbox').where({ alert_id: alertId }).orderBy('id')) as Row[]).map(toRow);
  },
};
