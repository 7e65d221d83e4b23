// The alert state machine driven with explicit instants (an injected clock, no sleeps).
import { describe, expect, it } from 'vitest';
import { advance, OK_STATE, type GroupState, type Observation, type Timing, type TransitionKind } from '../../../shared/rules/state-machine';

const yes = (value = 1): Observation => ({ kind: 'value', value, firing: true });
const no = (value = 0): Observation => ({ kind: 'value', value, firing: false });
const gap: Observation = { kind: 'no_data', reason: 'no_data' };

/** Feeds observations at 15 s steps from t = 0; returns each step's status and transitions. */
function run(obs: Observation[], timing: Timing, start: GroupState = OK_STATE) {
  let s = start;
  return obs.map((o, i) => {
    const r = advance(s, o, i * 15_000, timing);
    s = r.state;
    return { t: i * 15_000, status: s.status, transitions: r.transitions as TransitionKind[], state: s };
  });
}

describe('alert state machine', () => {
  it('goes pending, then raised once the condition has held for the sustain time', () => {
    const steps = run([no(), yes(), yes(), yes(), yes(), yes()], { sustainMs: 60_000, clearMs: 0 });
    expect(steps.map((s) => s.status)).toEqual(['ok', 'pending', 'pending', 'pending', 'pending', 'raised']);
    expect(steps[1]!.transitions).toEqual(['pending']);
    expect(steps[5]!.transitions).toEqual(['raised']);
    expect(steps[5]!.state).toMatchObject({ pendingSince: 15_000, raisedAt: 75_000 });
  });

  it('raises at once with no sustain time', () => {
    const steps = run([yes()], { sustainMs: 0, clearMs: 0 });
    expect(steps[0]).toMatchObject({ status: 'raised', transitions: ['pending', 'raised'] });
  });

  it('drops a pending alert whose condition turns false before the sustain time', () => {
    const steps = run([yes(), yes(), no(), yes()], { sustainMs: 60_000, clearMs: 0 });
    expect(steps.map((s) => s.status)).toEqual(['pending', 'pending', 'ok', 'pending']);
    expect(steps[2]!.transitions).toEqual(['dropped']);
    // The sustain time counts from the new start, not the old one.
    expect(steps[3]!.state.pendingSince).toBe(45_000);
  });

  it('clears only after the condition has been false for the clear time, and a flap restarts the timer', () => {
    const steps = run([yes(), no(), no(), yes(), no(), no(), no(), no(), no()], { sustainMs: 0, clearMs: 60_000 });
    expect(steps.map((s) => s.status)).toEqual(['raised', 'raised', 'raised', 'raised', 'raised', 'raised', 'raised', 'raised', 'ok']);
    expect(steps[8]!.transitions).toEqual(['cleared']);
    expect(steps[4]!.state.falseSince).toBe(60_000);
  });

  it('treats no data as its own state: never a silent clear, never a false raise', () => {
    const timing = { sustainMs: 30_000, clearMs: 30_000 };
    // Raised, then the data stops: the alert is held (still raised underneath), not cleared.
    const held = run([yes(), yes(), yes(), gap, gap, gap, gap], timing);
    expect(held.map((s) => s.status)).toEqual(['pending', 'pending', 'raised', 'no_data', 'no_data', 'no_data', 'no_data']);
    expect(held[3]!.transitions).toEqual(['no_data']);
    expect(held[6]!.state).toMatchObject({ heldRaised: true, raisedAt: 30_000, noDataSince: 45_000, noDataReason: 'no_data' });
    expect(held.flatMap((s) => s.transitions)).not.toContain('cleared');

    // Pending, then no data, then the condition again: the sustain time starts over (no false raise).
    const pending = run([yes(), yes(), gap, gap, gap, yes(), yes()], timing);
    expect(pending.map((s) => s.status)).toEqual(['pending', 'pending', 'no_data', 'no_data', 'no_data', 'pending', 'pending']);
    expect(pending[5]!.transitions).toEqual(['data_back', 'pending']);
    expect(pending[5]!.state.pendingSince).toBe(75_000);

    // An ok group whose data stops shows no data; when data returns with the condition false it ends.
    const idle = run([no(), gap, no()], timing);
    expect(idle.map((s) => s.status)).toEqual(['ok', 'no_data', 'ok']);
    expect(idle[2]!.transitions).toEqual(['data_back', 'dropped']);
  });

  it('resumes a held raise when data returns, and clears it only after the clear time', () => {
    const steps = run([yes(), gap, yes(), no(), no(), no()], { sustainMs: 0, clearMs: 30_000 });
    expect(steps.map((s) => s.status)).toEqual(['raised', 'no_data', 'raised', 'raised', 'raised', 'ok']);
    expect(steps[2]!.transitions).toEqual(['data_back']);
    expect(steps[5]!.transitions).toEqual(['cleared']);
  });

  it('keeps the reason for no data (no traffic is not zero)', () => {
    const steps = run([{ kind: 'no_data', reason: 'no_traffic' }, gap], { sustainMs: 0, clearMs: 0 });
    expect(steps[0]!.state.noDataReason).toBe('no_traffic');
    expect(steps[1]!.transitions).toEqual([]);
    expect(steps[1]!.state.noDataReason).toBe('no_data');
  });

  it('continues from a stored state exactly as if it had never stopped (restart mid-pending)', () => {
    const timing = { sustainMs: 60_000, clearMs: 0 };
    const first = run([yes(), yes()], timing);
    // A restarted evaluator reads the stored state back and carries on at a later instant.
    const stored: GroupState = JSON.parse(JSON.stringify(first[1]!.state));
    const r = advance(stored, yes(), 60_000, timing);
    expect(r).toMatchObject({ state: { status: 'raised', pendingSince: 0, raisedAt: 60_000 }, transitions: ['raised'] });
  });

  it('never mutates the state it is given', () => {
    const s = { ...OK_STATE };
    advance(s, yes(), 0, { sustainMs: 0, clearMs: 0 });
    expect(s).toEqual(OK_STATE);
  });
});
