// What one cycle changes, decided without I/O: each group's observation goes through the state
// machine; the result says which alerts open, change or end, which events to record and which
// transitions to tell people about (nothing during a maintenance window of the rule's service).
import type { GroupEvaluation } from '../../shared/rules/evaluate-rule';
import type { Labels } from '../../shared/rules/label-groups';
import { advance, OK_STATE, sameState, type GroupState, type Observation, type TransitionKind } from '../../shared/rules/state-machine';
import type { OpenAlert } from '../../server/rules/repositories/alerts-repo';
import type { LiveRule } from '../../server/rules/repositories/evaluation-data-repo';
import type { NotifiedTransition } from '../../server/rules/notification-payload';

export interface NotifyIntent {
  transition: NotifiedTransition;
  value: number | null;
  endReason: string | null;
}

export interface GroupChange {
  ruleId: number;
  groupKey: string;
  labels: Labels;
  /** Absent: the alert opens now. */
  alertId: number | null;
  openedAt: number;
  before: GroupState;
  after: GroupState;
  transitions: TransitionKind[];
  planned: boolean;
  raiseNotified: boolean;
  /** Set when the alert ends now. */
  endReason: string | null;
  notify: NotifyIntent[];
}

export interface RulePlanInput {
  rule: LiveRule;
  at: number;
  /** null: the rule could not be evaluated this cycle (its open alerts are left as they are). */
  evaluations: GroupEvaluation[] | null;
  /** The rule matched at least one live series (otherwise every group has no data). */
  hasSeries: boolean;
  open: OpenAlert[];
  inMaintenance: boolean;
}

/** Key of the one group a rule without any series shows (no data for the whole rule). */
export const WHOLE_RULE_KEY = '[]';

export function planRule(input: RulePlanInput): GroupChange[] {
  const { rule, at, open, inMaintenance } = input;
  if (input.evaluations === null) return [];
  const timing = { sustainMs: rule.document.sustain * 1000, clearMs: rule.document.clear * 1000 };
  const openByKey = new Map(open.map((a) => [a.groupKey, a]));
  const observed: Array<{ key: string; labels: Labels; obs: Observation | 'gone' }> = input.evaluations.map((e) => ({ key: e.key, labels: e.labels, obs: e.observation }));
  const seen = new Set(observed.map((o) => o.key));
  for (const a of open) {
    if (seen.has(a.groupKey)) continue;
    // Without any series the whole rule has no data; with series, a group that vanished is gone.
    observed.push({ key: a.groupKey, labels: a.labels, obs: input.hasSeries ? 'gone' : { kind: 'no_data', reason: 'no_data' } });
    seen.add(a.groupKey);
  }
  if (!input.hasSeries && observed.length === 0) observed.push({ key: WHOLE_RULE_KEY, labels: {}, obs: { kind: 'no_data', reason: 'no_data' } });

  const changes: GroupChange[] = [];
  for (const o of observed) {
    const alert = openByKey.get(o.key) ?? null;
    const before = alert?.state ?? OK_STATE;
    let after: GroupState;
    let transitions: TransitionKind[];
    let endReason: string | null = null;
    if (o.obs === 'gone') {
      after = { ...OK_STATE, value: before.value };
      transitions = [before.status === 'raised' || before.heldRaised ? 'cleared' : 'dropped'];
      endReason = 'series_gone';
    } else {
      ({ state: after, transitions } = advance(before, o.obs, at, timing));
      if (after.status === 'ok' && before.status !== 'ok') endReason = transitions.includes('cleared') ? 'cleared' : 'dropped';
    }
    if (!alert && after.status === 'ok') continue;

    let planned = alert?.planned ?? false;
    let raiseNotified = alert?.raiseNotified ?? false;
    if (inMaintenance) planned = true;
    const notify: NotifyIntent[] = [];
    const value = after.value;
    for (const t of transitions) {
      if (t === 'raised' && !inMaintenance) {
        notify.push({ transition: 'raised', value, endReason: null });
        raiseNotified = true;
      } else if (t === 'cleared' && raiseNotified && !inMaintenance) {
        notify.push({ transition: 'cleared', value, endReason });
      } else if (t === 'no_data' && after.heldRaised && raiseNotified && !inMaintenance) {
        notify.push({ transition: 'no_data', value, endReason: after.noDataReason });
      }
    }
    // Raised during maintenance and still raised after it: tell people now.
    const stillRaised = after.status === 'raised' || (after.status === 'no_data' && after.heldRaised);
    if (stillRaised && !raiseNotified && !inMaintenance) {
      notify.push({ transition: 'raised', value, endReason: null });
      raiseNotified = true;
    }

    const changed = !alert || !sameState(before, after) || transitions.length > 0 || planned !== alert.planned || raiseNotified !== alert.raiseNotified;
    changes.push({
      ruleId: rule.id,
      groupKey: o.key,
      labels: o.labels,
      alertId: alert?.id ?? null,
      openedAt: alert?.openedAt ?? at,
      before,
      after,
      transitions: changed ? transitions : [],
      planned,
      raiseNotified,
      endReason,
      notify,
    });
  }
  return changes;
}
