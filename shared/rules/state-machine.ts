// The alert state machine for one rule and one label group (DESIGN.md §3: pending → raised →
// cleared), pure: the evaluator, replay and tests all drive it with explicit instants.
//
// Choices where the issue is silent:
// - "no data" (and "no traffic", and too few peers for an outlier) is a state of its own. It never
//   raises and never clears: a raised alert whose data stops stays open (held), a pending one
//   loses its progress, because sustain means the condition was *seen* to hold that long.
// - The clear timer runs only while the condition is seen to be false; a gap restarts it.
// - A pending alert whose condition turns false before the sustain time ends without raising
//   ("dropped"): it is kept in history but never notified.

export type GroupStatus = 'ok' | 'pending' | 'raised' | 'no_data';
/** The states an open alert can be in. */
export type OpenAlertState = Exclude<GroupStatus, 'ok'>;
export type NoDataReason = 'no_data' | 'no_traffic' | 'too_few_peers';

export interface GroupState {
  status: GroupStatus;
  /** When the condition was first seen true in this episode (pending and raised). */
  pendingSince: number | null;
  raisedAt: number | null;
  /** Raised with the condition false: since when (the clear timer). */
  falseSince: number | null;
  noDataSince: number | null;
  noDataReason: NoDataReason | null;
  /** In no_data: the alert had been raised when its data went missing (it stays raised underneath). */
  heldRaised: boolean;
  /** The latest value seen (kept through no data). */
  value: number | null;
}

export const OK_STATE: GroupState = Object.freeze({
  status: 'ok',
  pendingSince: null,
  raisedAt: null,
  falseSince: null,
  noDataSince: null,
  noDataReason: null,
  heldRaised: false,
  value: null,
}) as GroupState;

export type Observation =
  | { kind: 'value'; value: number | null; firing: boolean }
  | { kind: 'no_data'; reason: NoDataReason };

/**
 * pending: an alert opened (condition true); raised: sustained long enough; cleared: a raised
 * alert's condition was false for the clear time; dropped: an open alert ended without ever being
 * raised; no_data: data went missing; data_back: it returned.
 */
export type TransitionKind = 'pending' | 'raised' | 'cleared' | 'dropped' | 'no_data' | 'data_back';

export interface Timing {
  sustainMs: number;
  clearMs: number;
}

export interface Advance {
  state: GroupState;
  transitions: TransitionKind[];
}

/** The next state of a group after observing `obs` at `at` (ms). Never mutates `prev`. */
export function advance(prev: GroupState, obs: Observation, at: number, timing: Timing): Advance {
  const transitions: TransitionKind[] = [];
  let s: GroupState = { ...prev };

  if (obs.kind === 'no_data') {
    if (s.status === 'ok') {
      s = { ...OK_STATE, status: 'no_data', noDataSince: at, noDataReason: obs.reason, value: prev.value };
      transitions.push('no_data');
    } else if (s.status === 'pending' || s.status === 'raised') {
      const held = s.status === 'raised';
      s = { ...s, status: 'no_data', noDataSince: at, noDataReason: obs.reason, heldRaised: held, falseSince: null, pendingSince: held ? s.pendingSince : null };
      transitions.push('no_data');
    } else if (s.noDataReason !== obs.reason) {
      // Still without data, for another reason (no traffic → series silent): shown, not a transition.
      s = { ...s, noDataReason: obs.reason };
    }
    return { state: s, transitions };
  }

  s.value = obs.value;
  if (s.status === 'no_data') {
    transitions.push('data_back');
    if (s.heldRaised) {
      s = { ...s, status: 'raised', noDataSince: null, noDataReason: null, heldRaised: false, falseSince: null };
    } else {
      // Progress from before the gap is not carried over: the episode starts again now.
      s = { ...OK_STATE, value: obs.value };
      if (!obs.firing) {
        transitions.push('dropped');
        return { state: s, transitions };
      }
    }
  }

  switch (s.status) {
    case 'ok':
      if (obs.firing) {
        s = { ...s, status: 'pending', pendingSince: at };
        transitions.push('pending');
        if (timing.sustainMs <= 0) {
          s = { ...s, status: 'raised', raisedAt: at };
          transitions.push('raised');
        }
      }
      break;
    case 'pending':
      if (!obs.firing) {
        s = { ...OK_STATE, value: obs.value };
        transitions.push('dropped');
      } else if (at - s.pendingSince! >= timing.sustainMs) {
        s = { ...s, status: 'raised', raisedAt: at };
        transitions.push('raised');
      }
      break;
    case 'raised':
      if (obs.firing) {
        s = { ...s, falseSince: null };
      } else {
        const since = s.falseSince ?? at;
        if (at - since >= timing.clearMs) {
          s = { ...OK_STATE, value: obs.value };
          transitions.push('cleared');
        } else {
          s = { ...s, falseSince: since };
        }
      }
      break;
    case 'no_data':
      // Handled above: no_data never survives a value observation.
      break;
  }
  return { state: s, transitions };
}

/** True when two states would be stored differently (the evaluator writes only changes). */
export function sameState(a: GroupState, b: GroupState): boolean {
  return (
    a.status === b.status &&
    a.pendingSince === b.pendingSince &&
    a.raisedAt === b.raisedAt &&
    a.falseSince === b.falseSince &&
    a.noDataSince === b.noDataSince &&
    a.noDataReason === b.noDataReason &&
    a.heldRaised === b.heldRaised
  );
}
