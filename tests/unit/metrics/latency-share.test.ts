import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { isExplicitBound, shareAbove } from '../../../shared/metrics/latency-share';

// "Exact on synthetic data" (DESIGN.md §6): raw observations are bucketed here and the share read
// back from the buckets is compared with the share counted on the raw values.

function bucketize(values: number[], bounds: number[]): number[] {
  const counts = new Array<number>(bounds.length + 1).fill(0);
  for (const v of values) {
    let i = 0;
    while (i < bounds.length && v > bounds[i]) i++;
    counts[i] += 1;
  }
  return counts;
}

const BOUNDS = [50, 100, 200, 300, 500, 1000];

describe('shareAbove', () => {
  it('is exact at an explicit bound, counting values equal to it as not above (property)', () => {
    fc.assert(
      fc.property(
        // Integers so many observations fall exactly on a bound.
        fc.array(fc.integer({ min: 0, max: 1500 }), { minLength: 1, maxLength: 200 }),
        fc.constantFrom(...BOUNDS),
        (values, bound) => {
          const raw = values.filter((v) => v > bound).length / values.length;
          expect(isExplicitBound(bound, BOUNDS)).toBe(true);
          expect(shareAbove(bound, { bounds: BOUNDS, counts: bucketize(values, BOUNDS) })).toBe(raw);
        },
      ),
    );
  });

  it('interpolates linearly between bounds, exact for evenly spread observations', () => {
    // 100 observations 101, 102, …, 200 in the (100, 200] bucket plus 20 above 1000.
    const values = [...Array.from({ length: 100 }, (_, i) => 101 + i), ...new Array<number>(20).fill(1200)];
    const h = { bounds: BOUNDS, counts: bucketize(values, BOUNDS) };
    expect(isExplicitBound(150, BOUNDS)).toBe(false);
    // 50 of the bucket above 150 (151…200) plus the 20 slow ones.
    expect(shareAbove(150, h)).toBeCloseTo(70 / 120, 12);
    expect(values.filter((v) => v > 150).length / values.length).toBeCloseTo(70 / 120, 12);
  });

  it('interpolates from 0 inside the first bucket', () => {
    expect(shareAbove(25, { bounds: [50, 100], counts: [10, 0, 0] })).toBe(0.5);
    expect(shareAbove(-5, { bounds: [50, 100], counts: [10, 0, 0] })).toBe(1);
  });

  it('is exact at a lowest bound of 0, whose bucket has no lower edge', () => {
    expect(shareAbove(0, { bounds: [0, 10], counts: [3, 5, 2] })).toBe(0.7);
  });

  it('counts the whole +Inf bucket as above a bound past the highest one', () => {
    expect(shareAbove(5000, { bounds: BOUNDS, counts: [10, 0, 0, 0, 0, 0, 10] })).toBe(0.5);
  });

  it('is null with no observations', () => {
    expect(shareAbove(100, { bounds: BOUNDS, counts: [0, 0, 0, 0, 0, 0, 0] })).toBeNull();
  });

  it('rejects a non-finite bound', () => {
    expect(() => shareAbove(Infinity, { bounds: BOUNDS, counts: [1, 0, 0, 0, 0, 0, 0] })).toThrow(RangeError);
  });
});
