import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { mannWhitneyExactCounts, mannWhitneyU } from '../../../shared/stats/mann-whitney';

// R. Shier, "The Mann-Whitney U Test", Mathematics Learning Support Centre (2004), via REFERENCES.md.
const A = [19, 22, 16, 29, 24];
const B = [20, 11, 17, 12];

/** U_A by its definition: pairs with a > b, ties counting ½. */
function pairCountU(a: number[], b: number[]): number {
  let u = 0;
  for (const x of a) for (const y of b) u += x > y ? 1 : x === y ? 0.5 : 0;
  return u;
}

/** Distribution of U for sizes m, n by enumerating every way to choose A's ranks. */
function bruteForceCounts(m: number, n: number): number[] {
  const counts = new Array<number>(m * n + 1).fill(0);
  const total = m + n;
  for (let mask = 0; mask < 1 << total; mask++) {
    let bits = 0;
    for (let i = 0; i < total; i++) if (mask & (1 << i)) bits++;
    if (bits !== m) continue;
    const a: number[] = [];
    const b: number[] = [];
    for (let i = 0; i < total; i++) (mask & (1 << i) ? a : b).push(i);
    counts[pairCountU(a, b)] += 1;
  }
  return counts;
}

describe('mannWhitneyU', () => {
  it('gives U_A = 17, U_B = 3 on Shier’s example (printed)', () => {
    const r = mannWhitneyU(A, B);
    expect(r?.uA).toBe(17);
    expect(r?.uB).toBe(3);
  });

  it('gives the exact two-sided p = 1/9 on Shier’s example (computed, REFERENCES.md)', () => {
    const r = mannWhitneyU(A, B);
    expect(r?.method).toBe('exact');
    expect(r?.p).toBeCloseTo(1 / 9, 14);
    expect(r?.p).toBeCloseTo(0.1111111, 7);
  });

  it('gives the normal approximation p = 0.1113469 with continuity correction (computed, REFERENCES.md)', () => {
    const r = mannWhitneyU(A, B, { method: 'normal' });
    expect(r?.method).toBe('normal');
    expect(r?.p).toBeCloseTo(0.1113469, 7);
    // σ_U = √(n₁n₂(n+1)/12) = √(200/12); z = (17 − 10 − ½)/σ_U; p = 2(1 − Φ(z)) via jstat.
    const z = (17 - 10 - 0.5) / Math.sqrt(200 / 12);
    expect(r?.z).toBeCloseTo(z, 12);
    expect(r?.p).toBeCloseTo(2 * (1 - jStat.normal.cdf(z, 0, 1)), 12);
  });

  it('gives one-sided exact tails that add up with the point probability', () => {
    const greater = mannWhitneyU(A, B, { alternative: 'greater' })?.p ?? NaN;
    const less = mannWhitneyU(A, B, { alternative: 'less' })?.p ?? NaN;
    // P(U ≥ 17) = P(U ≤ 3) = 7/126; P(U ≤ 17) = 1 − P(U ≥ 18) = 1 − 4/126 (counts 1,1,2,3 by symmetry).
    expect(greater).toBeCloseTo(7 / 126, 14);
    expect(less).toBeCloseTo(1 - 4 / 126, 14);
  });

  it('corrects σ_U for ties (Lehmann 1975 formula, hand computed)', () => {
    // A = [1,2,2], B = [2,3,3]: mid-ranks 1; 3,3,3; 5.5,5.5 → R_A = 7, U_A = 1. Tie groups of 3
    // and 2: Σ(t³−t) = 30; σ² = 9·7/12 − 9·30/(12·6·5) = 4.5; z = (1 − 4.5 + ½)/√4.5 = −√2;
    // two-sided p = 2Φ(−√2) = erfc(1) = 0.157299207050285.
    const r = mannWhitneyU([1, 2, 2], [2, 3, 3]);
    expect(r?.method).toBe('normal');
    expect(r?.uA).toBe(1);
    expect(r?.z).toBeCloseTo(-Math.SQRT2, 12);
    expect(r?.p).toBeCloseTo(0.157299207050285, 12);
    expect(r?.p).toBeCloseTo(2 * jStat.normal.cdf(-Math.SQRT2, 0, 1), 12);
  });

  it('returns p = 1 when every value is tied, and null for an empty sample', () => {
    expect(mannWhitneyU([5, 5], [5, 5, 5])?.p).toBe(1);
    expect(mannWhitneyU([], [1, 2])).toBeNull();
  });

  it('refuses the exact method with ties and non-finite values', () => {
    expect(() => mannWhitneyU([1, 2], [2, 3], { method: 'exact' })).toThrow(RangeError);
    expect(() => mannWhitneyU([1, NaN], [2, 3])).toThrow(RangeError);
  });

  it('switches to the normal approximation at 50 per sample', () => {
    const big = Array.from({ length: 50 }, (_, i) => i * 2);
    const other = Array.from({ length: 10 }, (_, i) => i * 2 + 1);
    expect(mannWhitneyU(big, other)?.method).toBe('normal');
    expect(mannWhitneyU(big.slice(0, 49), other)?.method).toBe('exact');
  });

  it('counts the exact distribution like brute-force enumeration', () => {
    for (const [m, n] of [[1, 1], [2, 3], [4, 4], [5, 4], [3, 7], [6, 6]]) {
      expect(Array.from(mannWhitneyExactCounts(m, n))).toEqual(bruteForceCounts(m, n));
    }
    // C(9, 4) = 126 arrangements for Shier's sizes.
    expect(Array.from(mannWhitneyExactCounts(5, 4)).reduce((s, c) => s + c, 0)).toBe(126);
  });

  it('computes U as the pair count and exact p as the enumerated tail (property)', () => {
    const distinctPair = fc
      .uniqueArray(fc.integer({ min: -1000, max: 1000 }), { minLength: 2, maxLength: 12 })
      .chain((values) => fc.integer({ min: 1, max: values.length - 1 }).map((k) => [values.slice(0, k), values.slice(k)] as const));
    fc.assert(
      fc.property(distinctPair, ([a, b]) => {
        const r = mannWhitneyU(a, b);
        const u = pairCountU(a, b);
        expect(r?.uA).toBe(u);
        expect(r?.uB).toBe(a.length * b.length - u);
        const counts = bruteForceCounts(a.length, b.length);
        const total = counts.reduce((s, c) => s + c, 0);
        const lower = counts.slice(0, u + 1).reduce((s, c) => s + c, 0) / total;
        const upper = counts.slice(u).reduce((s, c) => s + c, 0) / total;
        const expected = Math.min(1, 2 * (u > (a.length * b.length) / 2 ? upper : lower));
        expect(r?.p).toBeCloseTo(expected, 12);
      }),
      { numRuns: 60 },
    );
  });

  it('agrees with a jstat normal computation on tied data (reference library, property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 3, maxLength: 40 }),
        fc.array(fc.integer({ min: 0, max: 6 }), { minLength: 3, maxLength: 40 }),
        (a, b) => {
          const r = mannWhitneyU(a, b, { method: 'normal' });
          const n1 = a.length;
          const n2 = b.length;
          const n = n1 + n2;
          const groups = new Map<number, number>();
          for (const v of [...a, ...b]) groups.set(v, (groups.get(v) ?? 0) + 1);
          const tieSum = [...groups.values()].reduce((s, t) => s + t ** 3 - t, 0);
          const sigma = Math.sqrt((n1 * n2 * (n + 1)) / 12 - (n1 * n2 * tieSum) / (12 * n * (n - 1)));
          const u = pairCountU(a, b);
          expect(r?.uA).toBe(u);
          fc.pre(sigma > 0);
          const diff = u - (n1 * n2) / 2;
          const z = (diff - Math.sign(diff) * 0.5) / sigma;
          const expected = Math.min(1, 2 * Math.min(jStat.normal.cdf(z, 0, 1), 1 - jStat.normal.cdf(z, 0, 1)));
          expect(r?.p).toBeCloseTo(expected, 9);
        },
      ),
    );
  });
});
