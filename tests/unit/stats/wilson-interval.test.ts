import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import jStat from 'jstat';
import { Z_95, wilsonInterval } from '../../../shared/stats/wilson-interval';

describe('wilsonInterval', () => {
  // Newcombe, "Two-sided confidence intervals for the single proportion", Statistics in Medicine
  // 17:857–872 (1998), Table II; inputs from memory, bounds computed (REFERENCES.md), z = 1.959964.
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0.0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('%i of %i → %f–%f (Newcombe 1998, Table II)', (x, n, lower, upper) => {
    const ci = wilsonInterval(x, n);
    expect(ci).not.toBeNull();
    expect(ci?.lower.toFixed(4)).toBe(lower.toFixed(4));
    expect(ci?.upper.toFixed(4)).toBe(upper.toFixed(4));
    expect(ci?.estimate).toBe(x / n);
  });

  it('uses z = 1.959964 by default, the normal 97.5 % point (jstat)', () => {
    expect(Z_95).toBe(1.959964);
    expect(jStat.normal.inv(0.975, 0, 1)).toBeCloseTo(Z_95, 6);
  });

  it('pins 0 and n successes to the edges of [0, 1]', () => {
    expect(wilsonInterval(0, 5)?.lower).toBe(0);
    expect(wilsonInterval(5, 5)?.upper).toBe(1);
    expect(wilsonInterval(5, 5)?.lower).toBeLessThan(1);
  });

  it('is null without trials and rejects impossible counts', () => {
    expect(wilsonInterval(0, 0)).toBeNull();
    expect(() => wilsonInterval(3, 2)).toThrow(RangeError);
    expect(() => wilsonInterval(1.5, 2)).toThrow(RangeError);
  });

  it('brackets the estimate, stays in [0, 1] and mirrors failures and successes (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 100_000 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, share) => {
        const x = Math.round(share * n);
        const ci = wilsonInterval(x, n);
        const mirror = wilsonInterval(n - x, n);
        if (!ci || !mirror) throw new Error('expected an interval');
        expect(ci.lower).toBeGreaterThanOrEqual(0);
        expect(ci.upper).toBeLessThanOrEqual(1);
        expect(ci.lower).toBeLessThanOrEqual(ci.estimate);
        expect(ci.upper).toBeGreaterThanOrEqual(ci.estimate);
        expect(ci.lower).toBeCloseTo(1 - mirror.upper, 12);
        expect(ci.upper).toBeCloseTo(1 - mirror.lower, 12);
      }),
    );
  });
});
