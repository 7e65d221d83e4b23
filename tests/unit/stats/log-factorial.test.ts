import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { logChoose, logFactorial } from '../../../shared/stats/log-factorial';

describe('logFactorial', () => {
  it('is exact for small n', () => {
    expect(logFactorial(0)).toBe(0);
    expect(logFactorial(1)).toBe(0);
    expect(logFactorial(10)).toBeCloseTo(Math.log(3_628_800), 14);
  });

  it('joins the table and Stirling series seamlessly at 170/171', () => {
    expect(logFactorial(171) - logFactorial(170)).toBeCloseTo(Math.log(171), 12);
    expect(logFactorial(172) - logFactorial(171)).toBeCloseTo(Math.log(172), 12);
  });

  it('equals a sum of logs up to 5000 and jstat factorialln (reference library, property)', () => {
    let running = 0;
    const sums = [0];
    for (let k = 1; k <= 5000; k++) sums.push((running += Math.log(k)));
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 5000 }), (n) => {
        expect(Math.abs(logFactorial(n) - sums[n])).toBeLessThanOrEqual(1e-12 * Math.max(1, sums[n]));
        expect(Math.abs(logFactorial(n) - jStat.factorialln(n))).toBeLessThanOrEqual(1e-11 * Math.max(1, sums[n]));
      }),
    );
  });

  it('rejects negative and fractional n', () => {
    expect(() => logFactorial(-1)).toThrow(RangeError);
    expect(() => logFactorial(2.5)).toThrow(RangeError);
  });
});

describe('logChoose', () => {
  it('gives ln C(n, k) and −∞ outside the range', () => {
    expect(Math.exp(logChoose(8, 4))).toBeCloseTo(70, 10);
    expect(Math.exp(logChoose(9, 4))).toBeCloseTo(126, 10);
    expect(logChoose(5, 6)).toBe(-Infinity);
    expect(logChoose(5, -1)).toBe(-Infinity);
  });

  it('satisfies Pascal’s rule (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 1000 }), fc.nat(), (n, pick) => {
        const k = 1 + (pick % n);
        const lhs = Math.exp(logChoose(n, k) - logChoose(n + 1, k));
        const rhs = Math.exp(logChoose(n, k - 1) - logChoose(n + 1, k));
        expect(lhs + rhs).toBeCloseTo(1, 10);
      }),
    );
  });
});
