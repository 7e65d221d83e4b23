import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { median as ssMedian, medianAbsoluteDeviation } from 'simple-statistics';
import { MODIFIED_Z_THRESHOLD, findOutliers, modifiedZScores } from '../../../shared/metrics/outliers';

describe('modified z-score', () => {
  it('uses the published threshold 3.5', () => {
    // Iglewicz & Hoaglin, "How to Detect and Handle Outliers" (1993): flag |Mᵢ| > 3.5
    // (from memory, as REFERENCES.md labels it).
    expect(MODIFIED_Z_THRESHOLD).toBe(3.5);
  });

  it('computes 0.6745 (x − median) / MAD on a worked example', () => {
    // median 5, absolute deviations [4,3,2,1,0,1,2,3,4] → MAD 2 (hand computed).
    const scores = modifiedZScores([1, 2, 3, 4, 5, 6, 7, 8, 9]);
    expect(scores[0]).toBeCloseTo((0.6745 * -4) / 2, 12);
    expect(scores[4]).toBe(0);
    expect(scores[8]).toBeCloseTo((0.6745 * 4) / 2, 12);
  });

  it('flags just above 3.5 and not at or just below it', () => {
    // Base data: median 10, MAD 1 (hand computed); a value v scores 0.6745 (v − 10).
    const base = [8, 9, 9, 10, 10, 10, 11, 11, 12];
    const at = (m: number) => 10 + m / 0.6745;
    expect(findOutliers([...base, at(3.6)]).map((o) => o.index)).toEqual([9]);
    expect(findOutliers([...base, at(3.4)])).toEqual([]);
    expect(findOutliers([...base, at(-3.6)]).map((o) => o.index)).toEqual([9]);
  });

  it('agrees with scores built from simple-statistics median and MAD (reference library)', () => {
    // Distinct values keep MAD above 0 (the MAD = 0 fallback is tested on its own below).
    const distinct = fc
      .uniqueArray(fc.integer({ min: -10_000_000, max: 10_000_000 }), { minLength: 3, maxLength: 80 })
      .map((xs) => xs.map((x) => x / 1000));
    fc.assert(
      fc.property(distinct, (xs) => {
        const mad = medianAbsoluteDeviation(xs);
        expect(mad).toBeGreaterThan(0);
        const center = ssMedian(xs);
        const ours = modifiedZScores(xs);
        xs.forEach((x, i) => {
          const expected = (0.6745 * (x - center)) / mad;
          expect(Math.abs(ours[i] - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)));
        });
        const flagged = new Set(findOutliers(xs).map((o) => o.index));
        xs.forEach((x, i) => {
          const m = Math.abs((0.6745 * (x - center)) / mad);
          // Scores within rounding of the threshold may fall either way.
          if (Math.abs(m - 3.5) > 1e-6) expect(flagged.has(i)).toBe(m > 3.5);
        });
      }),
    );
  });

  it('falls back to the mean absolute deviation when MAD is 0', () => {
    // Mostly-zero error counts: median 0, MAD 0. MeanAD = 5/10 = 0.5, so the spike scores
    // 5 / (1.253314 · 0.5) ≈ 7.98 (hand computed) and is flagged.
    const counts = [0, 0, 0, 0, 0, 0, 0, 0, 0, 5];
    const scores = modifiedZScores(counts);
    expect(scores[9]).toBeCloseTo(5 / (1.253314 * 0.5), 9);
    expect(findOutliers(counts).map((o) => o.index)).toEqual([9]);
    // A few small values among zeros are not all declared outliers: MeanAD 0.4, score ≈ 1.99.
    expect(findOutliers([0, 0, 0, 0, 0, 0, 1, 1, 1, 1])).toEqual([]);
  });

  it('scores everything 0 when all values are equal', () => {
    expect(modifiedZScores([7, 7, 7])).toEqual([0, 0, 0]);
    expect(findOutliers([7, 7, 7])).toEqual([]);
  });

  it('gives NaN for non-finite inputs and ignores them in the yardstick', () => {
    const scores = modifiedZScores([1, 2, NaN, 3]);
    expect(scores[2]).toBeNaN();
    expect(scores[1]).toBe(0);
    expect(modifiedZScores([])).toEqual([]);
  });
});
