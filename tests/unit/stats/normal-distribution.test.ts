import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { erfc, normalCdf, normalUpperTail } from '../../../shared/stats/normal-distribution';

describe('normal distribution', () => {
  it('matches jstat normal.cdf across the usual range (reference library, property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -8, max: 8, noNaN: true }), (z) => {
        expect(normalCdf(z)).toBeCloseTo(jStat.normal.cdf(z, 0, 1), 13);
      }),
    );
  });

  it('matches jstat erfc to 1e-15 absolute (reference library)', () => {
    // jstat's erfc loses relative precision in the tail (it behaves like 1 − erf: about 1e−16
    // absolute), so the comparison is absolute here; tail precision is checked against libm below.
    for (let x = -3; x <= 6; x += 0.125) {
      expect(Math.abs(erfc(x) - jStat.erfc(x))).toBeLessThanOrEqual(1e-15);
    }
  });

  it.each([
    // Computed with Python's math.erfc (the C library's erfc, correct to about one ulp).
    [0.5, 0.4795001221869535],
    [1, 0.15729920705028513],
    [2, 0.004677734981047265],
    [2.5, 0.0004069520174449589],
    [3, 2.2090496998585438e-5],
    [3.25, 4.302779463675122e-6],
    [4, 1.541725790028002e-8],
    [5, 1.5374597944280351e-12],
    [6, 2.1519736712498916e-17],
  ])('erfc(%f) = %f to 1e-14 relative (computed, libm)', (x, expected) => {
    expect(Math.abs(erfc(x) - expected) / expected).toBeLessThan(1e-14);
  });

  it('reproduces well-known values', () => {
    // Standard normal table values, from memory: Φ(1) = 0.841344746068543, Φ(−3) = 0.00134989803163.
    expect(normalCdf(1)).toBeCloseTo(0.841344746068543, 14);
    expect(normalCdf(-3)).toBeCloseTo(0.00134989803163, 14);
    // The 95 % two-sided point used by the Wilson interval (Newcombe 1998).
    expect(normalCdf(1.959964)).toBeCloseTo(0.975, 7);
    expect(normalCdf(0)).toBe(0.5);
  });

  it('keeps relative precision deep in the tail', () => {
    // Mills-ratio asymptotics: Q(z) ≈ φ(z)/z · (1 − 1/z² + 3/z⁴ − 15/z⁶) for large z.
    for (const z of [10, 15, 20, 30]) {
      const phi = Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI);
      const series = (phi / z) * (1 - 1 / z ** 2 + 3 / z ** 4 - 15 / z ** 6);
      expect(Math.abs(normalUpperTail(z) - series) / series).toBeLessThan(105 / z ** 8 + 1e-13);
    }
  });

  it('is continuous where the method switches at x = 2', () => {
    // Across the switch the change must match the derivative −(2/√π)·e^(−x²).
    const h = 1e-6;
    const slope = (-2 / Math.sqrt(Math.PI)) * Math.exp(-4);
    expect((erfc(2 + h) - erfc(2 - h)) / (2 * h)).toBeCloseTo(slope, 8);
  });

  it('satisfies Φ(z) + Q(z) = 1 and symmetry (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -37, max: 37, noNaN: true }), (z) => {
        expect(normalCdf(z) + normalUpperTail(z)).toBeCloseTo(1, 14);
        expect(normalCdf(-z)).toBe(normalUpperTail(z));
      }),
    );
  });
});
