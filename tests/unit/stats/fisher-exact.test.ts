import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { fisherExact, type TwoByTwo } from '../../../shared/stats/fisher-exact';

describe('fisherExact', () => {
  // Fisher, "The Design of Experiments" (1935), ch. II, the lady tasting tea: 8 cups, 4 of each
  // kind; null counts of 0–4 correct are 1/16/36/16/1 of 70 (REFERENCES.md).
  it('gives p = 1/70 when all four cups are identified (Fisher 1935)', () => {
    expect(fisherExact([[4, 0], [0, 4]], 'greater')).toBeCloseTo(1 / 70, 14);
    expect(fisherExact([[4, 0], [0, 4]], 'greater')).toBeCloseTo(0.0142857, 7);
  });

  it('gives 17/70 one-sided and 0.4857 two-sided for [[3,1],[1,3]] (Fisher 1935; REFERENCES.md)', () => {
    expect(fisherExact([[3, 1], [1, 3]], 'greater')).toBeCloseTo(17 / 70, 14);
    expect(fisherExact([[3, 1], [1, 3]], 'greater')).toBeCloseTo(0.2429, 4);
    expect(fisherExact([[3, 1], [1, 3]], 'two-sided')).toBeCloseTo(0.4857, 4);
    // Two-sided sums the tables no more probable than the observed one: (1 + 16 + 16 + 1) / 70.
    expect(fisherExact([[3, 1], [1, 3]])).toBeCloseTo(34 / 70, 14);
  });

  it('reproduces the null distribution 1/16/36/16/1 of 70 through the tails', () => {
    const atLeast = [70, 69, 53, 17, 1]; // cumulative from the top
    for (let correct = 0; correct <= 4; correct++) {
      const table: TwoByTwo = [[correct, 4 - correct], [4 - correct, correct]];
      expect(fisherExact(table, 'greater')).toBeCloseTo(atLeast[correct] / 70, 14);
      expect(fisherExact(table, 'less')).toBeCloseTo(atLeast[4 - correct] / 70, 14);
    }
  });

  it('counts equally probable tables despite rounding (the relative tolerance)', () => {
    // [[2,2],[2,2]] is the most probable table: every table qualifies, p = 1.
    expect(fisherExact([[2, 2], [2, 2]])).toBe(1);
    // [[1,3],[3,1]] and [[3,1],[1,3]] are mirror images with equal probability.
    expect(fisherExact([[1, 3], [3, 1]])).toBeCloseTo(fisherExact([[3, 1], [1, 3]]), 14);
    // Hand computed: margins 1/9 and 5/5 allow two tables, C(9,5) and C(9,4) of C(10,5), both
    // 126/252 = ½, so two-sided p = 1; their log-space probabilities differ in the last bits.
    expect(fisherExact([[0, 1], [5, 4]])).toBeCloseTo(1, 14);
    // Margins 2/8 and 5/5: tables 0, 1, 2 have 56, 140, 56 of 252; the two extremes give 4/9.
    expect(fisherExact([[0, 2], [5, 3]])).toBeCloseTo(4 / 9, 14);
  });

  it('rejects negative or fractional cells', () => {
    expect(() => fisherExact([[-1, 2], [3, 4]])).toThrow(RangeError);
    expect(() => fisherExact([[1.5, 2], [3, 4]])).toThrow(RangeError);
  });

  it('matches sums of jstat hypergeometric probabilities on random tables (reference library)', () => {
    const cell = fc.integer({ min: 0, max: 60 });
    fc.assert(
      fc.property(cell, cell, cell, cell, (a, b, c, d) => {
        const table: TwoByTwo = [[a, b], [c, d]];
        const N = a + b + c + d;
        const row1 = a + b;
        const col1 = a + c;
        fc.pre(N > 0);
        // A ~ Hypergeometric: col1 draws from N holding row1 successes.
        const lo = Math.max(0, col1 - (c + d));
        const hi = Math.min(row1, col1);
        const pdf = (x: number) => jStat.hypgeom.pdf(x, N, row1, col1);
        let greater = 0;
        let less = 0;
        let two = 0;
        const observed = pdf(a);
        for (let x = lo; x <= hi; x++) {
          const px = pdf(x);
          if (x >= a) greater += px;
          if (x <= a) less += px;
          if (px <= observed * (1 + 1e-7)) two += px;
        }
        expect(fisherExact(table, 'greater')).toBeCloseTo(Math.min(1, greater), 9);
        expect(fisherExact(table, 'less')).toBeCloseTo(Math.min(1, less), 9);
        expect(fisherExact(table, 'two-sided')).toBeCloseTo(Math.min(1, two), 9);
      }),
    );
  });

  it('handles large release-watch counts without overflow', () => {
    // 10 000 runs each side, 0.5 % vs 1 % failures: strong evidence of a regression.
    const p = fisherExact([[100, 9900], [50, 9950]], 'greater');
    expect(p).toBeGreaterThan(0);
    expect(p).toBeLessThan(1e-4);
    expect(fisherExact([[50, 9950], [50, 9950]])).toBeCloseTo(1, 12);
  });
});
