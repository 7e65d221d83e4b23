import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { linearRegression, rSquared } from 'simple-statistics';
import { linearTrend, timeToLimit, trendValueAt } from '../../../shared/metrics/linear-trend';

/**
 * NIST Statistical Reference Datasets, linear least squares, "Norris" (Norris, J., NIST,
 * "Calibration of Ozone Monitors"; https://www.itl.nist.gov/div898/strd/lls/data/Norris.shtml).
 * 36 (x, y) observations in file order. Typed in from memory, then checked digit for digit
 * against several independent public copies of Norris.dat; that all four certified values match
 * to 1e-9 below is itself evidence the data are right (one wrong digit moves them far more).
 */
const NORRIS: ReadonlyArray<readonly [x: number, y: number]> = [
  [0.2, 0.1], [337.4, 338.8], [118.2, 118.1], [884.6, 888.0], [10.1, 9.2], [226.5, 228.1],
  [666.3, 668.5], [996.3, 998.5], [448.6, 449.1], [777.0, 778.9], [558.2, 559.2], [0.4, 0.3],
  [0.6, 0.1], [775.5, 778.1], [666.9, 668.8], [338.0, 339.3], [447.5, 448.9], [11.6, 10.8],
  [556.0, 557.7], [228.1, 228.3], [995.8, 998.0], [887.6, 888.8], [120.2, 119.6], [0.3, 0.3],
  [0.3, 0.6], [556.8, 557.6], [339.1, 339.3], [887.2, 888.0], [999.0, 998.5], [779.0, 778.9],
  [11.1, 10.2], [118.3, 117.6], [229.2, 228.9], [669.1, 668.4], [448.9, 449.2], [0.5, 0.2],
];

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('linearTrend', () => {
  it('matches the NIST StRD Norris certified values', () => {
    const fit = linearTrend(NORRIS.map(([x, y]) => ({ x, y })));
    expect(fit).not.toBeNull();
    if (!fit) return;
    expect(fit.n).toBe(36);
    // Certified values, NIST StRD Norris (printed in Norris.dat).
    expect(relativeError(fit.slope, 1.00211681802045)).toBeLessThan(1e-9);
    expect(relativeError(fit.intercept, -0.262323073774029)).toBeLessThan(1e-9);
    expect(relativeError(fit.residualSd ?? NaN, 0.884796396144373)).toBeLessThan(1e-9);
    expect(relativeError(fit.rSquared ?? NaN, 0.999993745883712)).toBeLessThan(1e-9);
  });

  it('agrees with simple-statistics linearRegression and rSquared on random data (reference library)', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({ x: fc.double({ min: -1000, max: 1000, noNaN: true }), y: fc.double({ min: -1000, max: 1000, noNaN: true }) }),
          { minLength: 3, maxLength: 60 },
        ),
        (points) => {
          const xs = points.map((p) => p.x);
          fc.pre(Math.max(...xs) - Math.min(...xs) > 1e-3);
          const fit = linearTrend(points);
          const pairs = points.map((p) => [p.x, p.y]);
          const ref = linearRegression(pairs);
          expect(fit).not.toBeNull();
          if (!fit) return;
          expect(fit.slope).toBeCloseTo(ref.m, 6);
          expect(fit.intercept).toBeCloseTo(ref.b, 6);
          if (fit.rSquared !== null) {
            const refR2 = rSquared(pairs, (x) => ref.b + ref.m * x);
            expect(fit.rSquared).toBeCloseTo(refR2, 6);
          }
        },
      ),
    );
  });

  it('keeps precision with millisecond-epoch timestamps', () => {
    // Disk filling by 2 MB/min from 10 GB, sampled every 15 s around November 2025.
    const t0 = 1_764_000_000_000;
    const points = Array.from({ length: 240 }, (_, i) => ({ x: t0 + i * 15_000, y: 10_000 + (2 / 60_000) * i * 15_000 }));
    const fit = linearTrend(points);
    expect(relativeError(fit?.slope ?? NaN, 2 / 60_000)).toBeLessThan(1e-9);
    expect(trendValueAt(fit ?? { slope: NaN, intercept: NaN }, t0)).toBeCloseTo(10_000, 4);
    expect(fit?.residualSd).toBeLessThan(1e-6);
    expect(fit?.rSquared).toBeCloseTo(1, 12);
  });

  it('is null with fewer than two points or a vertical line', () => {
    expect(linearTrend([{ x: 1, y: 1 }])).toBeNull();
    expect(linearTrend([{ x: 1, y: 1 }, { x: 1, y: 2 }])).toBeNull();
  });

  it('leaves residual SD null for two points and R² null for a flat series', () => {
    expect(linearTrend([{ x: 0, y: 1 }, { x: 1, y: 3 }])).toEqual({ slope: 2, intercept: 1, residualSd: null, rSquared: 1, n: 2 });
    const flat = linearTrend([{ x: 0, y: 5 }, { x: 1, y: 5 }, { x: 2, y: 5 }]);
    expect(flat?.slope).toBe(0);
    expect(flat?.rSquared).toBeNull();
    expect(flat?.residualSd).toBe(0);
  });
});

describe('timeToLimit', () => {
  const line = { slope: 2, intercept: 10 }; // y = 10 + 2x

  it('is the distance ahead of now where the line reaches the limit', () => {
    expect(timeToLimit(line, 50, 5)).toBe(15); // reaches 50 at x = 20
    expect(timeToLimit({ slope: -0.5, intercept: 100 }, 0, 40)).toBe(160); // free space falling to 0 at x = 200
  });

  it('is 0 when the line is at the limit now', () => {
    expect(timeToLimit(line, 30, 10)).toBe(0);
  });

  it('is null when the line is flat, heading away, or crossed in the past', () => {
    expect(timeToLimit({ slope: 0, intercept: 10 }, 50, 0)).toBeNull();
    expect(timeToLimit(line, 0, 0)).toBeNull(); // rising, limit below: crossing at x = −5
    expect(timeToLimit(line, 50, 25)).toBeNull(); // crossed at x = 20
  });

  it('forecasts a disk-full time from ms timestamps', () => {
    // 60 GB free, falling 1 GB per hour, sampled every minute for 6 hours.
    const t0 = 1_764_000_000_000;
    const hour = 3_600_000;
    const points = Array.from({ length: 361 }, (_, i) => ({ x: t0 + i * 60_000, y: 60 - (i * 60_000) / hour }));
    const fit = linearTrend(points);
    const now = t0 + 6 * hour; // 54 GB left
    expect((timeToLimit(fit ?? line, 0, now) ?? NaN) / hour).toBeCloseTo(54, 6);
  });
});
