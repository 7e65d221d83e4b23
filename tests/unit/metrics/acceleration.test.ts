import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { rateOfChange, timeToThreshold } from '../../../shared/metrics/acceleration';

// Calculus, exact on synthetic data (DESIGN.md §6): a rate r(t) = a + b·t has derivative b.

describe('rateOfChange', () => {
  it('is constant for a rate growing linearly in time (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: -1000, max: 1000 }), // a
        fc.integer({ min: -100, max: 100 }), // b, per second
        fc.array(fc.integer({ min: 1, max: 120 }), { minLength: 1, maxLength: 30 }), // gaps in s
        (a, b, gaps) => {
          let t = 0;
          const rates = [{ t: 0, v: a }];
          for (const g of gaps) {
            t += g;
            rates.push({ t: t * 1000, v: a + b * t });
          }
          const out = rateOfChange(rates);
          expect(out).toHaveLength(gaps.length);
          for (const p of out) expect(p.v).toBeCloseTo(b, 9);
        },
      ),
    );
  });

  it('stamps each difference at the later point', () => {
    expect(rateOfChange([{ t: 0, v: 1 }, { t: 60_000, v: 4 }, { t: 90_000, v: 1 }])).toEqual([
      { t: 60_000, v: 0.05 },
      { t: 90_000, v: -0.1 },
    ]);
  });

  it('does not bridge gaps with no data or repeated timestamps', () => {
    expect(
      rateOfChange([
        { t: 0, v: 1 },
        { t: 15_000, v: null },
        { t: 30_000, v: 3 },
        { t: 45_000, v: 6 },
        { t: 45_000, v: 9 },
      ]),
    ).toEqual([{ t: 45_000, v: 0.2 }]);
  });
});

describe('timeToThreshold', () => {
  it('is (limit − value) / rate when approaching from either side', () => {
    expect(timeToThreshold(20, 0.5, 80)).toBe(120); // error rate climbing to its limit
    expect(timeToThreshold(100, -2, 10)).toBe(45); // free space falling to its floor
  });

  it('is 0 at the limit and null when moving away or standing still', () => {
    expect(timeToThreshold(80, 0.5, 80)).toBe(0);
    expect(timeToThreshold(20, -0.5, 80)).toBeNull();
    expect(timeToThreshold(100, 2, 10)).toBeNull();
    expect(timeToThreshold(20, 0, 80)).toBeNull();
    expect(timeToThreshold(20, NaN, 80)).toBeNull();
  });

  it('lands the value exactly on the limit after the returned time (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e3, max: 1e3, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        (value, rate, limit) => {
          const seconds = timeToThreshold(value, rate, limit);
          if (seconds === null) {
            const movingAway = rate === 0 || Math.sign(limit - value) !== Math.sign(rate);
            expect(value !== limit && (movingAway || !Number.isFinite((limit - value) / rate))).toBe(true);
          } else {
            expect(seconds).toBeGreaterThanOrEqual(0);
            expect(value + rate * seconds).toBeCloseTo(limit, 3);
          }
        },
      ),
    );
  });
});
