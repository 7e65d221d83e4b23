import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { quantile as ssQuantile } from 'simple-statistics';
import { histogramQuantile } from '../../../shared/metrics/histogram-quantile';
import { assertHistogram, histogramBucketsSchema } from '../../../shared/metrics/histogram';

/** Bucket raw observations the way an instrumented service would (upper-inclusive buckets). */
function bucketize(values: number[], bounds: number[]): number[] {
  const counts = new Array<number>(bounds.length + 1).fill(0);
  for (const v of values) {
    let i = 0;
    while (i < bounds.length && v > bounds[i]) i++;
    counts[i] += 1;
  }
  return counts;
}

const LATENCY_BOUNDS = [5, 10, 25, 50, 100, 250, 500, 1000, 2500, 5000, 10000];

describe('histogramQuantile', () => {
  it('reproduces the NCERT grouped-data median', () => {
    // NCERT Mathematics Class X, ch. 14 "Statistics", Example 7 (printed): heights below 140: 4;
    // 140–145: 7; 145–150: 18; 150–155: 11; 155–160: 6; 160–165: 5; N = 51 →
    // median = 145 + (25.5 − 11)/18 · 5 = 149.03.
    const h = { bounds: [140, 145, 150, 155, 160, 165], counts: [4, 7, 18, 11, 6, 5, 0] };
    const median = histogramQuantile(0.5, h);
    expect(median).toBeCloseTo(149.03, 2);
    expect(median).toBeCloseTo(145 + ((25.5 - 11) / 18) * 5, 12);
  });

  it('starts the lowest bucket at 0 when bounds are positive', () => {
    // 10 observations in (0, 100]: the median interpolates from 0, not from −∞ or 100.
    expect(histogramQuantile(0.5, { bounds: [100, 200], counts: [10, 0, 0] })).toBe(50);
  });

  it('returns the upper bound of an unbounded-below first bucket', () => {
    expect(histogramQuantile(0.5, { bounds: [0, 10], counts: [4, 0, 0] })).toBe(0);
  });

  it('returns the highest finite bound for a rank in the +Inf bucket', () => {
    const h = { bounds: [100, 200], counts: [1, 1, 8] };
    expect(histogramQuantile(0.99, h)).toBe(200);
    expect(histogramQuantile(1, h)).toBe(200);
  });

  it('lands p = 0 on the first non-empty bucket and p = 1 on the last', () => {
    const h = { bounds: [10, 20, 30, 40], counts: [0, 5, 5, 0, 0] };
    expect(histogramQuantile(0, h)).toBe(10);
    expect(histogramQuantile(1, h)).toBe(30);
  });

  it('is null with no observations or no finite bounds', () => {
    expect(histogramQuantile(0.5, { bounds: [1, 2], counts: [0, 0, 0] })).toBeNull();
    expect(histogramQuantile(0.5, { bounds: [], counts: [7] })).toBeNull();
  });

  it('rejects malformed histograms and quantiles', () => {
    expect(() => histogramQuantile(0.5, { bounds: [1, 2], counts: [1, 1] })).toThrow(RangeError);
    expect(() => histogramQuantile(0.5, { bounds: [2, 1], counts: [1, 1, 1] })).toThrow(RangeError);
    expect(() => histogramQuantile(0.5, { bounds: [1, 2], counts: [1, -1, 1] })).toThrow(RangeError);
    expect(() => histogramQuantile(1.5, { bounds: [1], counts: [1, 1] })).toThrow(RangeError);
    expect(() => assertHistogram({ bounds: [1, Infinity], counts: [1, 1, 1] })).toThrow(RangeError);
  });

  it('has a zod schema with the same shape rules', () => {
    expect(histogramBucketsSchema.safeParse({ bounds: [1, 2], counts: [1, 2, 3] }).success).toBe(true);
    expect(histogramBucketsSchema.safeParse({ bounds: [1, 2], counts: [1, 2] }).success).toBe(false);
    expect(histogramBucketsSchema.safeParse({ bounds: [2, 1], counts: [1, 2, 3] }).success).toBe(false);
  });

  it('falls in the bucket of the order statistic holding rank N·p, on any data (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0.001, max: 10000, noNaN: true }), { minLength: 1, maxLength: 300 }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        (values, p) => {
          // The bucket holding rank N·p is the one holding the ⌈N·p⌉-th smallest value (buckets
          // are upper-inclusive, so an estimate on a bucket's upper edge still belongs to it).
          const sorted = [...values].sort((a, b) => a - b);
          const orderStatistic = sorted[Math.max(0, Math.ceil(values.length * p) - 1)];
          const estimate = histogramQuantile(p, { bounds: LATENCY_BOUNDS, counts: bucketize(values, LATENCY_BOUNDS) });
          const bucketOf = (x: number) => LATENCY_BOUNDS.findIndex((b) => x <= b);
          expect(estimate).not.toBeNull();
          expect(bucketOf(estimate ?? NaN)).toBe(bucketOf(orderStatistic));
        },
      ),
    );
  });

  it('lies within one bucket width of simple-statistics quantile on raw latencies (reference library)', () => {
    // Raw data: 2000 log-normal latencies from a seeded generator (mulberry32 + Box–Muller), dense
    // enough that simple-statistics' interpolated quantile (R type 7) sits among its neighbours.
    const mulberry32 = (seed: number) => () => {
      seed = (seed + 0x6d2b79f5) | 0;
      let t = Math.imul(seed ^ (seed >>> 15), 1 | seed);
      t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
      return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
    fc.assert(
      fc.property(
        fc.integer(),
        fc.double({ min: 2, max: 6, noNaN: true }), // μ of ln(latency ms)
        fc.double({ min: 0.2, max: 1, noNaN: true }), // σ of ln(latency ms)
        fc.constantFrom(0.05, 0.25, 0.5, 0.75, 0.9, 0.95, 0.99),
        (seed, mu, sigma, p) => {
          const random = mulberry32(seed);
          const values = Array.from({ length: 2000 }, () => {
            const u = 1 - random();
            const z = Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
            return Math.exp(mu + sigma * z);
          });
          const estimate = histogramQuantile(p, { bounds: LATENCY_BOUNDS, counts: bucketize(values, LATENCY_BOUNDS) });
          const raw = ssQuantile(values, p);
          const widthOf = (x: number) => {
            const i = LATENCY_BOUNDS.findIndex((b) => x <= b);
            return i < 0 ? Infinity : LATENCY_BOUNDS[i] - (i === 0 ? 0 : LATENCY_BOUNDS[i - 1]);
          };
          expect(estimate).not.toBeNull();
          expect(Math.abs((estimate ?? NaN) - raw)).toBeLessThanOrEqual(Math.max(widthOf(estimate ?? NaN), widthOf(raw)));
        },
      ),
      { numRuns: 60 },
    );
  });
});
