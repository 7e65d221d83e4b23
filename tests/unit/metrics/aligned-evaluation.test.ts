import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  MAX_ALIGNED_POINTS,
  alignedTimestamps,
  evaluateAligned,
  evaluateAlignedSeries,
} from '../../../shared/metrics/aligned-evaluation';
import { counterIncrease, counterRate } from '../../../shared/metrics/counter-increase';

const series = (values: number[], intervalMs = 15_000) => values.map((v, i) => ({ t: i * intervalMs, v }));

describe('alignedTimestamps', () => {
  it('puts points on multiples of the step inside [from, to]', () => {
    expect(alignedTimestamps(61_000, 241_000, 60_000)).toEqual([120_000, 180_000, 240_000]);
    expect(alignedTimestamps(60_000, 180_000, 60_000)).toEqual([60_000, 120_000, 180_000]);
  });

  it('is empty when no multiple of the step falls inside the range', () => {
    expect(alignedTimestamps(61_000, 119_000, 60_000)).toEqual([]);
  });

  it('refuses a step that would produce too many points', () => {
    expect(() => alignedTimestamps(0, 30 * 86_400_000, 1)).toThrow(/limit/);
    expect(alignedTimestamps(0, (MAX_ALIGNED_POINTS - 1) * 1000, 1000)).toHaveLength(MAX_ALIGNED_POINTS);
  });

  it('rejects a non-positive step or reversed range', () => {
    expect(() => alignedTimestamps(0, 10, 0)).toThrow(RangeError);
    expect(() => alignedTimestamps(10, 0, 1)).toThrow(RangeError);
  });
});

describe('evaluateAligned', () => {
  it('computes increase and rate over the trailing window at each step', () => {
    // A counter growing 15 per 15 s sample, reset at 90 s.
    const samples = series([0, 15, 30, 45, 60, 75, 5, 20, 35]);
    const increase = evaluateAligned(samples, { from: 0, to: 120_000, stepMs: 30_000, windowMs: 60_000, fn: 'increase' });
    expect(increase).toEqual([
      { t: 0, v: null }, // one sample in [−60 s, 0]
      { t: 30_000, v: 30 },
      { t: 60_000, v: 60 },
      { t: 90_000, v: 50 }, // 30→45→60→75 is 45, then the reset to 5 counts 5
      { t: 120_000, v: 50 }, // 60→75 is 15, reset counts 5, 5→20→35 is 30
    ]);
    const rate = evaluateAligned(samples, { from: 0, to: 120_000, stepMs: 30_000, windowMs: 60_000, fn: 'rate' });
    expect(rate.map((p) => p.v)).toEqual([null, 0.5, 1, 50 / 60, 50 / 60]);
  });

  it('matches counterIncrease and counterRate at every point (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat({ max: 100_000 }), { minLength: 0, maxLength: 50 }),
        fc.integer({ min: 1, max: 120 }).map((s) => s * 1000),
        fc.integer({ min: 1, max: 300 }).map((s) => s * 1000),
        (values, stepMs, windowMs) => {
          const samples = series(values);
          const to = values.length * 15_000;
          for (const fn of ['increase', 'rate'] as const) {
            const points = evaluateAligned(samples, { from: 0, to, stepMs, windowMs, fn });
            for (const p of points) {
              const expected = fn === 'increase' ? counterIncrease(samples, p.t - windowMs, p.t) : counterRate(samples, p.t - windowMs, p.t);
              if (expected === null) expect(p.v).toBeNull();
              else expect(p.v).toBeCloseTo(expected, 9);
            }
          }
        },
      ),
    );
  });

  it('computes gauge functions over the window and null where it is empty', () => {
    const samples = [
      { t: 10_000, v: 4 },
      { t: 20_000, v: 8 },
      { t: 30_000, v: 6 },
    ];
    const q = { from: 0, to: 60_000, stepMs: 30_000, windowMs: 20_000 };
    expect(evaluateAligned(samples, { ...q, fn: 'last' })).toEqual([
      { t: 0, v: null },
      { t: 30_000, v: 6 },
      { t: 60_000, v: null },
    ]);
    expect(evaluateAligned(samples, { ...q, fn: 'mean' })[1].v).toBe(6);
    expect(evaluateAligned(samples, { ...q, fn: 'max' })[1].v).toBe(8);
    expect(evaluateAligned(samples, { ...q, fn: 'min' })[1].v).toBe(4);
  });

  it('evaluates several series on the same instants, keeping labels', () => {
    const out = evaluateAlignedSeries(
      [
        { labels: { instance: 'a' }, samples: series([0, 10, 20]) },
        { labels: { instance: 'b' }, samples: series([0, 1]) },
      ],
      { from: 0, to: 30_000, stepMs: 15_000, windowMs: 30_000, fn: 'increase' },
    );
    expect(out.map((s) => s.labels.instance)).toEqual(['a', 'b']);
    expect(out[0].points.map((p) => p.t)).toEqual(out[1].points.map((p) => p.t));
    expect(out[0].points.map((p) => p.v)).toEqual([null, 10, 20]);
    expect(out[1].points.map((p) => p.v)).toEqual([null, 1, 1]);
  });

  it('rejects a non-positive window', () => {
    expect(() => evaluateAligned([], { from: 0, to: 10, stepMs: 1, windowMs: 0, fn: 'rate' })).toThrow(RangeError);
  });
});
