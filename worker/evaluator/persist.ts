// Writes one cycle's changes in one transaction: alerts opened, changed and ended, their events,
// the notification outbox rows and their delivery jobs (queued in the same transaction, so a
// state change and its notifications commit or vanish together). Changes to a rule that was
// edited, disabled or deleted while the cycle ran are dropped: the cycle judged an old version.
import type { Knex } from 'knex';
import type PgBoss from 'pg-boss';
import type { NotifyJob } from '../../shared/jobs';
import { alertsRepo, type AlertEventInsert, type AlertInsert, type AlertUpdate } from '../../server/rules/repositories/alerts-repo';
import type { LiveRule } from '../../server/rules/repositories/evaluation-data-repo';
import { outboxRepo, type OutboxInsert } from '../../server/rules/repositories/outbox-repo';
import { buildPayload } from '../../server/rules/notification-payload';
import { knexExecutor } from '../../server/rules/queue-in-transaction';
import { NOTIFY_QUEUE } from '../notifier/queues';
import type { GroupChange } from './plan';

export interface PersistResult {
  opened: number;
  ended: number;
  transitions: number;
  notifications: number;
  /** Rules whose changes were dropped (changed under the cycle). */
  staleRules: number;
}

export async function persistCycle(
  db: Knex,
  boss: PgBoss,
  at: number,
  rules: Map<number, LiveRule>,
  changes: GroupChange[],
  enabledChannels: Set<number>,
): Promise<PersistResult> {
  return db.transaction(async (tx) => {
    const ruleIds = [...new Set(changes.map((c) => c.ruleId))];
    // FOR SHARE: an edit of the rule (FOR UPDATE) waits for this transaction, and vice versa.
    const current = ruleIds.length
      ? ((await tx.raw('SELECT id, version FROM alert_rules WHERE id = ANY(?::bigint[]) AND enabled AND deleted_at IS NULL FOR SHARE', [ruleIds])).rows as { id: number; version: number }[])
      : [];
    const live = new Map(current.map((r) => [r.id, r.version]));
    const isFresh = (ruleId: number) => live.get(ruleId) === rules.get(ruleId)?.version;
    const fresh = changes.filter((c) => isFresh(c.ruleId));
    const staleRules = ruleIds.filter((id) => !isFresh(id)).length;

    const inserts: AlertInsert[] = [];
    const updates: AlertUpdate[] = [];
    for (const c of fresh) {
      const closing = c.after.status === 'ok';
      if (c.alertId === null) {
        inserts.push({ ruleId: c.ruleId, groupKey: c.groupKey, labels: c.labels, state: c.after, openedAt: c.openedAt, planned: c.planned, raiseNotified: c.raiseNotified, evaluatedAt: at });
      } else {
        updates.push({
          id: c.alertId,
          state: closing ? { ...c.after, pendingSince: c.before.pendingSince, raisedAt: c.before.raisedAt } : c.after,
          planned: c.planned,
          raiseNotified: c.raiseNotified,
          evaluatedAt: at,
          clearedAt: closing ? at : null,
          endReason: closing ? c.endReason : null,
        });
      }
    }
    const newIds = await alertsRepo.insertOpen(tx, inserts);
    const written = await alertsRepo.updateOpen(tx, updates);
    const idOf = (c: GroupChange) => (c.alertId !== null ? (written.has(c.alertId) ? c.alertId : null) : (newIds.get(`${c.ruleId}\u0001${c.groupKey}`) ?? null));

    const events: AlertEventInsert[] = [];
    const mail: OutboxInsert[] = [];
    const hooks: OutboxInsert[] = [];
    let transitions = 0;
    for (const c of fresh) {
      const alertId = idOf(c);
      if (alertId === null) continue;
      for (const t of c.transitions) {
        transitions++;
        const state = t === 'cleared' || t === 'dropped' ? 'cleared' : c.after.status === 'ok' ? 'cleared' : c.after.status;
        events.push({ alertId, at, transition: t, state, value: c.after.value });
      }
      const rule = rules.get(c.ruleId)!;
      for (const n of c.notify) {
        const payload = buildPayload({
          alertId,
          ruleId: rule.id,
          service: rule.service,
          rule: rule.document,
          transition: n.transition,
          labels: c.labels,
          value: n.value,
          at,
          openedAt: c.openedAt,
          raisedAt: c.after.raisedAt ?? c.before.raisedAt,
          endReason: n.endReason,
          noDataReason: c.after.noDataReason,
        });
        const base = { alertId, ruleId: rule.id, transition: n.transition, recipients: [] as string[], channelId: null, payload };
        if (rule.document.recipients.length) mail.push({ ...base, channel: 'mail', recipients: rule.document.recipients });
        for (const channelId of rule.document.channelIds) if (enabledChannels.has(channelId)) hooks.push({ ...base, channel: 'webhook', channelId });
      }
    }
    await alertsRepo.insertEvents(tx, events);
    const queued: Array<[string, number]> = [
      ...(await outboxRepo.insert(tx, mail)).map((id): [string, number] => [NOTIFY_QUEUE.mail, id]),
      ...(await outboxRepo.insert(tx, hooks)).map((id): [string, number] => [NOTIFY_QUEUE.webhook, id]),
    ];
    const executor = knexExecutor(tx);
    for (const [queue, outboxId] of queued) {
      const id = await boss.send(queue, { outboxId } satisfies NotifyJob, { db: executor });
      if (!id) throw new Error(`queue ${queue} is missing: notification ${outboxId} could not be queued`);
    }
    return {
      opened: newIds.size,
      ended: fresh.filter((c) => c.after.status === 'ok' && c.alertId !== null).length,
      transitions,
      notifications: queued.length,
      staleRules,
    };
  });
}
