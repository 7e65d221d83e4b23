import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  counterIncrease,
  counterRate,
  cumulativeIncrease,
  resetAwareDelta,
} from '../../../shared/metrics/counter-increase';
import type { Sample } from '../../../shared/metrics/sample';

// Counter increase with resets is common practice with no published source (DESIGN.md §6): the
// checks are worked examples plus property tests.

const at = (seconds: number, v: number): Sample => ({ t: seconds * 1000, v });

/** Samples one second apart from a list of counter values. */
const series = (values: number[], startMs = 0): Sample[] => values.map((v, i) => ({ t: startMs + i * 1000, v }));

/** Random counter values: mostly climbing, sometimes dropping (a reset) to a smaller value. */
const counterValues = fc.array(fc.nat({ max: 1_000_000 }), { minLength: 0, maxLength: 40 });

describe('resetAwareDelta', () => {
  it('is the difference when the counter grew or stayed', () => {
    expect(resetAwareDelta(10, 25)).toBe(15);
    expect(resetAwareDelta(7, 7)).toBe(0);
  });

  it('counts the new value from zero after a drop', () => {
    expect(resetAwareDelta(100, 4)).toBe(4);
    expect(resetAwareDelta(100, 0)).toBe(0);
  });
});

describe('counterIncrease', () => {
  it('sums deltas inside the window and treats a drop as a reset', () => {
    // 0 → 10 → 20, restart, 5 → 15: 10 + 10 + 5 + 10
    expect(counterIncrease(series([0, 10, 20, 5, 15]), 0, 4000)).toBe(35);
  });

  it('includes samples exactly on both window edges and ignores those outside', () => {
    const samples = [at(0, 100), at(10, 110), at(20, 130), at(30, 160), at(40, 200)];
    expect(counterIncrease(samples, 10_000, 30_000)).toBe(50);
    expect(counterIncrease(samples, 9_999, 30_001)).toBe(50);
    expect(counterIncrease(samples, 10_001, 30_000)).toBe(30);
  });

  it('returns null (no data), not 0, with fewer than two samples', () => {
    expect(counterIncrease([], 0, 60_000)).toBeNull();
    expect(counterIncrease([at(5, 42)], 0, 60_000)).toBeNull();
    expect(counterIncrease([at(5, 42), at(70, 50)], 0, 60_000)).toBeNull();
  });

  it('returns 0 for two equal samples: data, but no growth', () => {
    expect(counterIncrease([at(0, 42), at(15, 42)], 0, 60_000)).toBe(0);
  });

  it('accepts samples out of time order', () => {
    const samples = [at(20, 30), at(0, 10), at(10, 15)];
    expect(counterIncrease(samples, 0, 20_000)).toBe(20);
  });

  it('rejects a window that ends before it starts', () => {
    expect(() => counterIncrease(series([1, 2]), 5000, 1000)).toThrow(RangeError);
  });

  it('is never negative, whatever the resets (property)', () => {
    fc.assert(
      fc.property(counterValues, fc.nat({ max: 50_000 }), fc.nat({ max: 50_000 }), (values, a, b) => {
        const inc = counterIncrease(series(values), Math.min(a, b), Math.max(a, b));
        expect(inc === null || inc >= 0).toBe(true);
      }),
    );
  });

  it('equals last − first on a series without resets (property)', () => {
    const climbing = fc
      .tuple(fc.nat({ max: 1_000_000 }), fc.array(fc.nat({ max: 10_000 }), { minLength: 1, maxLength: 40 }))
      .map(([start, steps]) => steps.reduce<number[]>((acc, s) => [...acc, acc[acc.length - 1] + s], [start]));
    fc.assert(
      fc.property(climbing, (values) => {
        const samples = series(values);
        expect(counterIncrease(samples, 0, samples[samples.length - 1].t)).toBe(values[values.length - 1] - values[0]);
      }),
    );
  });

  it('adds up when a window is split at any sample inside it (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat({ max: 1_000_000 }), { minLength: 3, maxLength: 40 }),
        fc.nat(),
        (values, pick) => {
          const samples = series(values);
          const from = samples[0].t;
          const to = samples[samples.length - 1].t;
          // Split at an interior sample so each part keeps two samples or more.
          const split = samples[1 + (pick % (samples.length - 2))].t;
          const whole = counterIncrease(samples, from, to);
          const left = counterIncrease(samples, from, split);
          const right = counterIncrease(samples, split, to);
          expect(left).not.toBeNull();
          expect(right).not.toBeNull();
          expect((left ?? NaN) + (right ?? NaN)).toBe(whole);
        },
      ),
    );
  });

  it('agrees with the running total used by aligned evaluation (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.nat({ max: 1_000_000 }), { minLength: 2, maxLength: 40 }), (values) => {
        const samples = series(values);
        const totals = cumulativeIncrease(samples);
        expect(totals[totals.length - 1]).toBe(counterIncrease(samples, 0, samples[samples.length - 1].t));
      }),
    );
  });
});

describe('counterRate', () => {
  it('divides the increase by the window length in seconds', () => {
    // 60 requests in a 60 s window → 1 per second
    const samples = [at(0, 1000), at(15, 1015), at(30, 1030), at(45, 1045), at(60, 1060)];
    expect(counterRate(samples, 0, 60_000)).toBe(1);
    // Same growth seen through a 120 s window is half the rate: the nominal window is used.
    expect(counterRate(samples, 0, 120_000)).toBe(0.5);
  });

  it('is null when the increase is null', () => {
    expect(counterRate([at(0, 1)], 0, 60_000)).toBeNull();
  });

  it('rejects an empty window', () => {
    expect(() => counterRate(series([1, 2]), 1000, 1000)).toThrow(RangeError);
  });
});
