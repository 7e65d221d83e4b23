// Alerts and their events. An open alert (state ≠ cleared) is also the evaluator's stored state
// for its group, so reads and writes here speak the state machine's GroupState. Writes are bulk
// (jsonb_to_recordset): one statement per kind of change per cycle, whatever the number of groups.
import type { Knex } from 'knex';
import type { AlertEventView, AlertState, AlertView } from '../../../shared/rules/api-schemas';
import type { Labels } from '../../../shared/rules/label-groups';
import { describeCondition, type RuleDocument } from '../../../shared/rules/rule-schema';
import type { GroupState, NoDataReason, OpenAlertState, TransitionKind } from '../../../shared/rules/state-machine';

export interface OpenAlert {
  id: number;
  ruleId: number;
  groupKey: string;
  labels: Labels;
  state: GroupState;
  planned: boolean;
  raiseNotified: boolean;
  openedAt: number;
}

/** A new open alert (its id comes back from the insert). */
export interface AlertInsert {
  ruleId: number;
  groupKey: string;
  labels: Labels;
  state: GroupState;
  openedAt: number;
  planned: boolean;
  raiseNotified: boolean;
  evaluatedAt: number;
}

/** The full new content of an open alert; `clearedAt` closes it. */
export interface AlertUpdate {
  id: number;
  state: GroupState;
  planned: boolean;
  raiseNotified: boolean;
  evaluatedAt: number;
  clearedAt: number | null;
  endReason: string | null;
}

export interface AlertEventInsert {
  alertId: number;
  at: number;
  transition: TransitionKind;
  state: AlertState;
  value: number | null;
}

const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
const ms = (d: Date | null) => (d ? d.getTime() : null);

interface OpenRow {
  id: number;
  rule_id: number;
  group_key: string;
  labels: Labels;
  state: OpenAlertState;
  no_data_reason: NoDataReason | null;
  held_raised: boolean;
  value: number | null;
  opened_at: Date;
  pending_since: Date | null;
  raised_at: Date | null;
  false_since: Date | null;
  no_data_since: Date | null;
  planned: boolean;
  raise_notified: boolean;
}

function toOpen(r: OpenRow): OpenAlert {
  return {
    id: r.id,
    ruleId: r.rule_id,
    groupKey: r.group_key,
    labels: r.labels,
    planned: r.planned,
    raiseNotified: r.raise_notified,
    openedAt: r.opened_at.getTime(),
    state: {
      status: r.state,
      pendingSince: ms(r.pending_since),
      raisedAt: ms(r.raised_at),
      falseSince: ms(r.false_since),
      noDataSince: ms(r.no_data_since),
      noDataReason: r.no_data_reason,
      heldRaised: r.held_raised,
      value: r.value,
    },
  };
}

interface ViewRow extends OpenRow {
  cleared_at: Date | null;
  end_reason: string | null;
  last_evaluated_at: Date | null;
  rule_name: string;
  kind: RuleDocument['kind'];
  document: RuleDocument;
  service: string;
  state_: AlertState;
}

const VIEW_SELECT = `
  SELECT a.*, a.state AS state_, r.name AS rule_name, r.kind, r.document, r.service_id, s.name AS service
  FROM alerts a JOIN alert_rules r ON r.id = a.rule_id JOIN services s ON s.id = r.service_id`;

function toView(r: ViewRow): AlertView {
  const doc = r.document;
  return {
    id: r.id,
    ruleId: r.rule_id,
    ruleName: r.rule_name,
    kind: r.kind,
    service: r.service,
    severity: doc.severity,
    responderNote: doc.responderNote,
    runbookUrl: doc.runbookUrl ?? null,
    condition: describeCondition(doc),
    labels: r.labels,
    state: r.state_,
    noDataReason: r.no_data_reason,
    heldRaised: r.held_raised,
    value: r.value,
    planned: r.planned,
    openedAt: r.opened_at.toISOString(),
    pendingSince: r.pending_since?.toISOString() ?? null,
    raisedAt: r.raised_at?.toISOString() ?? null,
    clearedAt: r.cleared_at?.toISOString() ?? null,
    endReason: r.end_reason,
    lastEvaluatedAt: r.last_evaluated_at?.toISOString() ?? null,
  };
}

const RECORD_COLUMNS = `state text, no_data_reason text, held_raised boolean, value float8, pending_since timestamptz, raised_at timestamptz,
  false_since timestamptz, no_data_since timestamptz, planned boolean, raise_notified boolean, last_evaluated_at timestamptz`;

function stateColumns(s: GroupState) {
  return {
    state: s.status,
    no_data_reason: s.noDataReason,
    held_raised: s.heldRaised,
    value: s.value !== null && Number.isFinite(s.value) ? s.value : null,
    pending_since: iso(s.pendingSince),
    raised_at: iso(s.raisedAt),
    false_since: iso(s.falseSince),
    no_data_since: iso(s.noDataSince),
  };
}

export interface AlertListFilter {
  ruleId?: number;
  service?: string;
}

function filterSql(f: AlertListFilter, args: Knex.RawBinding[]): string {
  let sql = '';
  if (f.ruleId !== undefined) {
    sql += ' AND a.rule_id = ?';
    args.push(f.ruleId);
  }
  if (f.service !== undefined) {
    sql += ' AND s.name = ?';
    args.push(f.service);
  }
  return sql;
}

export const alertsRepo = {
  /** Open alerts of the given rules (all rules when omitted). */
  async open(db: Knex, ruleIds?: number[]): Promise<OpenAlert[]> {
    const q = db('alerts').whereNot('state', 'cleared');
    if (ruleIds) q.whereIn('rule_id', ruleIds);
    return ((await q.select('*')) as OpenRow[]).map(toOpen);
  },

  /** Inserts open alerts; a group that already has an open alert is skipped. Returns the new ids by rule and group. */
  async insertOpen(db: Knex, rows: AlertInsert[]): Promise<Map<string, number>> {
    if (rows.length === 0) return new Map();
    const records = rows.map((r) => ({
      rule_id: r.ruleId,
      group_key: r.groupKey,
      labels: r.labels,
      ...stateColumns(r.state),
      opened_at: iso(r.openedAt),
      planned: r.planned,
      raise_notified: r.raiseNotified,
      last_evaluated_at: iso(r.evaluatedAt),
    }));
    const res = await db.raw(
      `INSERT INTO alerts (rule_id, group_key, labels, state, no_data_reason, held_raised, value, pending_since, raised_at, false_since,
                           no_data_since, planned, raise_notified, last_evaluated_at, opened_at)
       SELECT rule_id, group_key, labels, state, no_data_reason, held_raised, value, pending_since, raised_at, false_since,
              no_data_since, planned, raise_notified, last_evaluated_at, opened_at
       FROM jsonb_to_recordset(?::jsonb) AS x(rule_id bigint, group_key text, labels jsonb, ${RECORD_COLUMNS}, opened_at timestamptz)
       ON CONFLICT (rule_id, group_key) WHERE state <> 'cleared' DO NOTHING
       RETURNING id, rule_id, group_key`,
      [JSON.stringify(records)],
    );
    return new Map((res.rows as { id: number; rule_id: number; group_key: string }[]).map((r) => [`${r.rule_id}\u0001${r.group_key}`, r.id]));
  },

  /** Rewrites open alerts (state, timers, value); closes those with clearedAt. Returns the ids written. */
  async updateOpen(db: Knex, rows: AlertUpdate[]): Promise<Set<number>> {
    if (rows.length === 0) return new Set();
    const records = rows.map((r) => {
      const closing = r.clearedAt !== null;
      return {
        id: r.id,
        ...stateColumns(r.state),
        ...(closing ? { state: 'cleared', false_since: null } : {}),
        planned: r.planned,
        raise_notified: r.raiseNotified,
        last_evaluated_at: iso(r.evaluatedAt),
        cleared_at: iso(r.clearedAt),
        end_reason: r.endReason,
      };
    });
    const res = await db.raw(
      `UPDATE alerts a SET state = x.state, no_data_reason = x.no_data_reason, held_raised = x.held_raised, value = x.value,
         pending_since = x.pending_since, raised_at = x.raised_at, false_since = x.false_since, no_data_since = x.no_data_since,
         planned = x.planned, raise_notified = x.raise_notified, last_evaluated_at = x.last_evaluated_at,
         cleared_at = x.cleared_at, end_reason = x.end_reason, updated_at = now()
       FROM jsonb_to_recordset(?::jsonb) AS x(id bigint, ${RECORD_COLUMNS}, cleared_at timestamptz, end_reason text)
       WHERE a.id = x.id AND a.state <> 'cleared'
       RETURNING a.id`,
      [JSON.stringify(records)],
    );
    return new Set((res.rows as { id: number }[]).map((r) => r.id));
  },

  async insertEvents(db: Knex, events: AlertEventInsert[]): Promise<void> {
    if (events.length === 0) return;
    await db.raw(
      `INSERT INTO alert_events (alert_id, at, transition, state, value)
       SELECT alert_id, at, transition, state, value FROM jsonb_to_recordset(?::jsonb) AS x(alert_id bigint, at timestamptz, transition text, state text, value float8)`,
      [JSON.stringify(events.map((e) => ({ alert_id: e.alertId, at: iso(e.at), transition: e.transition, state: e.state, value: e.value !== null && Number.isFinite(e.value) ? e.value : null })))],
    );
  },

  /**
   * Ends every open alert of a rule (the rule changed, was disabled or deleted), with an event.
   * Nothing is notified: the person who changed the rule knows.
   */
  async closeForRule(db: Knex, ruleId: number, at: Date, reason: string): Promise<number> {
    const res = await db.raw(
      `WITH closed AS (
         UPDATE alerts a SET state = 'cleared', cleared_at = ?, end_reason = ?, false_since = NULL, updated_at = now()
         FROM alerts b WHERE a.id = b.id AND a.rule_id = ? AND a.state <> 'cleared'
         RETURNING a.id, b.state AS was, a.value
       )
       INSERT INTO alert_events (alert_id, at, transition, state, value)
       SELECT id, ?, CASE WHEN was = 'raised' THEN 'cleared' ELSE 'dropped' END, 'cleared', value FROM closed`,
      [at, reason, ruleId, at],
    );
    return res.rowCount ?? 0;
  },

  /** Open now: raised, then no data, then pending; pages before tickets; newest first. */
  async listNow(db: Knex, f: AlertListFilter): Promise<AlertView[]> {
    const args: Knex.RawBinding[] = [];
    const sql = `${VIEW_SELECT} WHERE a.state <> 'cleared' AND r.deleted_at IS NULL${filterSql(f, args)}
      ORDER BY CASE a.state WHEN 'raised' THEN 0 WHEN 'no_data' THEN 1 ELSE 2 END,
               CASE r.document->>'severity' WHEN 'page' THEN 0 ELSE 1 END, a.opened_at DESC, a.id DESC
      LIMIT 1000`;
    return ((await db.raw(sql, args)).rows as ViewRow[]).map(toView);
  },

  /** Ended alerts, newest first, `limit` + 1 rows (to tell whether there is a next page). */
  async listHistory(db: Knex, f: AlertListFilter & { all: boolean; before?: number }, limit: number): Promise<AlertView[]> {
    const args: Knex.RawBinding[] = [];
    let sql = `${VIEW_SELECT} WHERE a.state = 'cleared'${filterSql(f, args)}`;
    if (!f.all) sql += ' AND a.raised_at IS NOT NULL';
    if (f.before !== undefined) {
      sql += ' AND a.id < ?';
      args.push(f.before);
    }
    sql += ' ORDER BY a.id DESC LIMIT ?';
    args.push(limit + 1);
    return ((await db.raw(sql, args)).rows as ViewRow[]).map(toView);
  },

  async view(db: Knex, id: number): Promise<(AlertView & { document: RuleDocument; groupKey: string; serviceId: number }) | null> {
    const r = (await db.raw(`${VIEW_SELECT} WHERE a.id = ?`, [id])).rows[0] as (ViewRow & { service_id: number }) | undefined;
    return r ? { ...toView(r), document: r.document, groupKey: r.group_key, serviceId: r.service_id } : null;
  },

  async events(db: Knex, alertId: number): Promise<AlertEventView[]> {
    const rows = await db('alert_events').where({ alert_id: alertId }).orderBy([{ column: 'at' }, { column: 'id' }]).select('at', 'transition', 'state', 'value');
    return rows.map((e: { at: Date; transition: TransitionKind; state: AlertState; value: number | null }) => ({
      at: e.at.toISOString(),
      transition: e.transition,
      state: e.state,
      value: e.value,
    }));
  },
};
