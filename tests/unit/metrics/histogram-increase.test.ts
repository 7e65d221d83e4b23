import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { histogramDelta, histogramIncrease } from '../../../shared/metrics/histogram-increase';
import { counterIncrease } from '../../../shared/metrics/counter-increase';
import type { HistogramPoint } from '../../../shared/metrics/histogram';

// Cumulative-histogram growth follows the counter rule per bucket (common practice, DESIGN.md §6);
// exact on synthetic data plus properties.

const B = [100, 250, 500];
const point = (seconds: number, counts: number[], bounds = B): HistogramPoint => ({ t: seconds * 1000, bounds, counts });

describe('histogramDelta', () => {
  it('subtracts bucket by bucket when nothing went down', () => {
    expect(histogramDelta(point(0, [10, 5, 2, 1]), point(15, [14, 5, 3, 1]))).toEqual({ bounds: B, counts: [4, 0, 1, 0] });
  });

  it('treats a drop in any bucket as a reset of the whole histogram', () => {
    // Bucket 0 rose but bucket 1 fell: a restart, so the new counts are the growth.
    expect(histogramDelta(point(0, [10, 5, 2, 1]), point(15, [12, 1, 0, 0]))).toEqual({ bounds: B, counts: [12, 1, 0, 0] });
  });

  it('treats a change of bucket layout as a reset', () => {
    expect(histogramDelta(point(0, [10, 5, 2, 1]), point(15, [3, 3, 3], [100, 1000]))).toEqual({
      bounds: [100, 1000],
      counts: [3, 3, 3],
    });
  });
});

describe('histogramIncrease', () => {
  it('sums consecutive deltas inside the window, across a reset', () => {
    const points = [
      point(0, [10, 5, 2, 1]),
      point(15, [14, 5, 3, 1]), // +4 0 +1 0
      point(30, [2, 1, 0, 0]), // reset: +2 +1 0 0
      point(45, [5, 2, 0, 1]), // +3 +1 0 +1
      point(60, [9, 9, 9, 9]), // outside the window
    ];
    expect(histogramIncrease(points, 0, 45_000)).toEqual({ bounds: B, counts: [9, 2, 1, 1] });
  });

  it('restarts the total when the layout changes inside the window', () => {
    const points = [point(0, [1, 1, 1, 1]), point(15, [2, 2, 2, 2]), point(30, [4, 4, 4], [50, 500]), point(45, [5, 6, 7], [50, 500])];
    expect(histogramIncrease(points, 0, 45_000)).toEqual({ bounds: [50, 500], counts: [5, 6, 7] });
  });

  it('is null with fewer than two points', () => {
    expect(histogramIncrease([point(0, [1, 1, 1, 1])], 0, 60_000)).toBeNull();
  });

  it('matches counter growth of the total count and never goes negative (property)', () => {
    // Each point adds non-negative counts per bucket, with an occasional restart from zero.
    const steps = fc.array(
      fc.record({ add: fc.array(fc.nat({ max: 50 }), { minLength: 4, maxLength: 4 }), restart: fc.boolean() }),
      { minLength: 2, maxLength: 20 },
    );
    fc.assert(
      fc.property(steps, (spec) => {
        let counts = [0, 0, 0, 0];
        const points = spec.map((s, i) => {
          counts = (s.restart ? [0, 0, 0, 0] : counts).map((c, j) => c + s.add[j]);
          return point(i * 15, counts);
        });
        const to = (spec.length - 1) * 15_000;
        const inc = histogramIncrease(points, 0, to);
        expect(inc).not.toBeNull();
        for (const c of inc?.counts ?? []) expect(c).toBeGreaterThanOrEqual(0);
        if (!spec.slice(1).some((s) => s.restart)) {
          // Without restarts every bucket grows by exactly last − first.
          expect(inc?.counts).toEqual(points[points.length - 1].counts.map((c, j) => c - points[0].counts[j]));
          const totals = points.map((p) => ({ t: p.t, v: p.counts.reduce((a, b) => a + b, 0) }));
          expect(inc?.counts.reduce((a, b) => a + b, 0)).toBe(counterIncrease(totals, 0, to));
        }
      }),
    );
  });
});
