// Replay: a rule (saved or draft) evaluated over a past period with the same evaluation and state
// machine as the evaluator, so an engineer tunes it against history, not in production.
import { alignedTimestamps } from '../metrics';
import { evaluateRule, type RuleData } from './evaluate-rule';
import type { Labels } from './label-groups';
import type { RuleDocument } from './rule-schema';
import { advance, OK_STATE, type GroupState, type GroupStatus, type NoDataReason, type OpenAlertState } from './state-machine';

export interface ReplayPoint {
  t: number;
  /** The rule's value at t (null with no data, or a forecast that never reaches its limit). */
  v: number | null;
  state: GroupStatus;
  noData?: NoDataReason;
}

export interface ReplaySpan {
  state: OpenAlertState;
  from: number;
  /** null: still in this state at the end of the period. */
  to: number | null;
}

export interface ReplayGroup {
  key: string;
  labels: Labels;
  points: ReplayPoint[];
  spans: ReplaySpan[];
  /** How many times the group would have been raised (a raise held through no data counts once). */
  raisedCount: number;
}

export interface ReplayResult {
  from: number;
  to: number;
  stepMs: number;
  groups: ReplayGroup[];
  raisedCount: number;
}

/** The evaluator's cycle; replay never steps finer than this. */
export const DEFAULT_CYCLE_MS = 15_000;
/** Instants per replay: enough for a readable chart, few enough to answer quickly. */
export const MAX_REPLAY_STEPS = 4_000;

/** The step for a period: the evaluator's cycle, or a multiple of it that keeps the steps bounded. */
export function replayStepMs(fromMs: number, toMs: number, cycleMs: number = DEFAULT_CYCLE_MS, maxSteps: number = MAX_REPLAY_STEPS): number {
  const span = Math.max(0, toMs - fromMs);
  return Math.max(1, Math.ceil(span / maxSteps / cycleMs)) * cycleMs;
}

/**
 * Evaluates the rule at every step in [from, to] and feeds each group's observations through the
 * state machine, starting from "ok". The first window of the period reads samples before `from`:
 * load data from from − lookback.
 */
export function replayRule(rule: RuleDocument, data: RuleData, opts: { from: number; to: number; stepMs: number }): ReplayResult {
  const times = alignedTimestamps(opts.from, opts.to, opts.stepMs, MAX_REPLAY_STEPS * 4);
  const timing = { sustainMs: rule.sustain * 1000, clearMs: rule.clear * 1000 };
  const groups = new Map<string, ReplayGroup & { state: GroupState }>();
  for (const t of times) {
    for (const e of evaluateRule(rule, data, t)) {
      let g = groups.get(e.key);
      if (!g) {
        g = { key: e.key, labels: e.labels, points: [], spans: [], raisedCount: 0, state: OK_STATE };
        groups.set(e.key, g);
      }
      const step = advance(g.state, e.observation, t, timing);
      g.state = step.state;
      if (step.transitions.includes('raised')) g.raisedCount++;
      const point: ReplayPoint = { t, v: e.observation.kind === 'value' ? e.observation.value : null, state: step.state.status };
      if (e.observation.kind === 'no_data') point.noData = e.observation.reason;
      g.points.push(point);
      const open = g.spans[g.spans.length - 1];
      const status = step.state.status;
      if (open && open.to === null && open.state !== status) open.to = t;
      if (status !== 'ok' && (!open || open.to !== null)) g.spans.push({ state: status, from: t, to: null });
    }
  }
  const list = [...groups.values()]
    .sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0))
    .map(({ state: _state, ...g }) => g);
  return { from: opts.from, to: opts.to, stepMs: opts.stepMs, groups: list, raisedCount: list.reduce((n, g) => n + g.raisedCount, 0) };
}
