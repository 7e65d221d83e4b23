// Replay: the same evaluation and state machine over a past period, with spans and a raise count.
import { describe, expect, it } from 'vitest';
import { replayRule, replayStepMs } from '../../../shared/rules/replay';
import { data, every, rule, series, T0 } from './fixtures';

describe('replay', () => {
  it('shows the values, the pending and raised spans and how often the rule would have raised', () => {
    // A gauge at 1, above 5 between +10 min and +20 min, again between +40 and +41 min (a blip),
    // and missing between +50 and +55 min.
    const from = T0;
    const to = T0 + 60 * 60_000;
    const samples = every(15_000, from - 300_000, to, (t) => {
      const m = (t - from) / 60_000;
      return (m >= 10 && m < 20) || (m >= 40 && m < 41) ? 10 : 1;
    }).filter((s) => {
      const m = (s.t - from) / 60_000;
      return !(m > 50 && m < 55);
    });
    const r = rule({ kind: 'threshold', aggregation: 'last', op: '>', threshold: 5, window: 60, sustain: 120, clear: 60 });
    const out = replayRule(r, data({ series: [series(1, {}, samples)] }), { from, to, stepMs: 15_000 });
    expect(out.groups).toHaveLength(1);
    const g = out.groups[0]!;
    expect(g.points).toHaveLength(241);
    const min = (m: number) => from + m * 60_000;
    expect(g.spans).toEqual([
      { state: 'pending', from: min(10), to: min(12) },
      { state: 'raised', from: min(12), to: min(21) }, // false from +20 (last sample 1 at +20), clear after 60 s
      { state: 'pending', from: min(40), to: min(41) }, // a blip shorter than the sustain time
      { state: 'no_data', from: min(51) + 15_000, to: min(55) }, // the 60 s window empties at +51:15
    ]);
    expect(g.raisedCount).toBe(1);
    expect(out.raisedCount).toBe(1);
    expect(g.points.find((p) => p.t === min(15))).toEqual({ t: min(15), v: 10, state: 'raised' });
    expect(g.points.find((p) => p.t === min(53))).toEqual({ t: min(53), v: null, state: 'no_data', noData: 'no_data' });
  });

  it('steps at the evaluator cycle, coarser only to bound the number of steps', () => {
    expect(replayStepMs(0, 3_600_000)).toBe(15_000);
    const week = replayStepMs(0, 7 * 86_400_000);
    expect(week % 15_000).toBe(0);
    expect((7 * 86_400_000) / week).toBeLessThanOrEqual(4000);
  });
});
