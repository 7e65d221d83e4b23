import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { binomialUpperTail } from '../../../shared/stats/binomial-tail';

/** P(X ≥ k) from jstat's binomial pdf, summed over the whole tail (reference library). */
function jstatUpperTail(k: number, n: number, p: number): number {
  let sum = 0;
  for (let i = Math.max(0, k); i <= n; i++) sum += jStat.binomial.pdf(i, n, p);
  return sum;
}

describe('binomialUpperTail', () => {
  it('gives P(X ≥ 3) = 0.18406 for 15 trials at p = 0.1', () => {
    // REFERENCES.md, "Proportions": upper tail 3 of 15 with p = 0.1 → 0.18406 (computed).
    expect(binomialUpperTail(3, 15, 0.1)).toBeCloseTo(0.18406, 5);
    // jstat's cdf (rounded by jstat to 10 decimals) as a second reference.
    expect(binomialUpperTail(3, 15, 0.1)).toBeCloseTo(1 - jStat.binomial.cdf(2, 15, 0.1), 9);
  });

  it('handles the edges of k and p', () => {
    expect(binomialUpperTail(0, 10, 0.3)).toBe(1);
    expect(binomialUpperTail(-2, 10, 0.3)).toBe(1);
    expect(binomialUpperTail(11, 10, 0.3)).toBe(0);
    expect(binomialUpperTail(1, 10, 0)).toBe(0);
    expect(binomialUpperTail(10, 10, 1)).toBe(1);
    expect(binomialUpperTail(10, 10, 0.5)).toBeCloseTo(1 / 1024, 15);
  });

  it('rejects invalid arguments', () => {
    expect(() => binomialUpperTail(1, 10, 1.2)).toThrow(RangeError);
    expect(() => binomialUpperTail(1, 10.5, 0.2)).toThrow(RangeError);
    expect(() => binomialUpperTail(1.5, 10, 0.2)).toThrow(RangeError);
  });

  it('equals the sum of jstat binomial probabilities on random inputs (reference library)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 400 }),
        fc.double({ min: 0.0005, max: 0.9995, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (n, p, where) => {
          const k = Math.round(where * (n + 1));
          const expected = jstatUpperTail(k, n, p);
          const actual = binomialUpperTail(k, n, p);
          expect(Math.abs(actual - expected)).toBeLessThanOrEqual(1e-12 + 1e-9 * expected);
        },
      ),
    );
  });

  it('stays accurate for a million requests (spike test scale)', () => {
    // 1e6 requests at a 0.1 % baseline: mean 1000, sd ≈ 31.6. jstat's binomial.pdf overflows at
    // this n, so the references are the pmf rebuilt from jstat's gammaln, summed over the tail
    // that matters (terms beyond +90 sd are below 1e-300), and jstat's regularised incomplete
    // beta, P(X ≥ k) = I_p(k, n − k + 1).
    const n = 1_000_000;
    const p = 0.001;
    const logPmf = (i: number) =>
      jStat.gammaln(n + 1) - jStat.gammaln(i + 1) - jStat.gammaln(n - i + 1) + i * Math.log(p) + (n - i) * Math.log1p(-p);
    for (const k of [950, 1000, 1100, 1200]) {
      let summed = 0;
      for (let i = k; i < k + 3000; i++) summed += Math.exp(logPmf(i));
      const actual = binomialUpperTail(k, n, p);
      expect(Math.abs(actual - summed)).toBeLessThanOrEqual(1e-7 * summed);
      expect(Math.abs(actual - jStat.ibeta(p, k, n - k + 1))).toBeLessThanOrEqual(1e-6 * summed);
    }
  });

  it('satisfies P(X ≥ k) = P(Y ≤ n − k) for Y ~ Bin(n, 1 − p) at large n (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1000, max: 2_000_000 }),
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.double({ min: -4, max: 4, noNaN: true }),
        (n, p, zScore) => {
          const k = Math.min(n, Math.max(1, Math.round(n * p + zScore * Math.sqrt(n * p * (1 - p)))));
          const upper = binomialUpperTail(k, n, p);
          const mirrored = 1 - binomialUpperTail(n - k + 1, n, 1 - p);
          expect(Math.abs(upper - mirrored)).toBeLessThan(1e-8);
        },
      ),
      { numRuns: 50 },
    );
  });
});
