import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  MIN_WINDOW_INTERVALS,
  checkWindow,
  estimateSamplingInterval,
  minimumWindowMs,
} from '../../../shared/metrics/window';
import { counterIncrease } from '../../../shared/metrics/counter-increase';

// The 2.5 × interval rule is common practice with no published source (DESIGN.md §6); these
// tests check the arithmetic and the property that motivates it.

describe('checkWindow', () => {
  it('accepts a window of at least 2.5 sampling intervals', () => {
    expect(MIN_WINDOW_INTERVALS).toBe(2.5);
    expect(checkWindow(37_500, 15_000)).toEqual({ ok: true });
    expect(checkWindow(60_000, 15_000)).toEqual({ ok: true });
  });

  it('names the smallest valid window in seconds when the window is too short', () => {
    const result = checkWindow(30_000, 15_000);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.minWindowMs).toBe(37_500);
    expect(result.message).toContain('37.5 s');
    expect(result.message).toContain('15 s');
  });

  it('rounds the minimum up to a whole millisecond', () => {
    expect(minimumWindowMs(1001)).toBe(2503); // 2502.5 → 2503
    expect(checkWindow(2502, 1001).ok).toBe(false);
    expect(checkWindow(2503, 1001).ok).toBe(true);
  });

  it('rejects a non-positive sampling interval', () => {
    expect(() => checkWindow(60_000, 0)).toThrow(RangeError);
  });

  it('is ok exactly when window ≥ 2.5 × interval (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 3_600_000 }), fc.integer({ min: 0, max: 10_000_000 }), (interval, window) => {
        const result = checkWindow(window, interval);
        expect(result.ok).toBe(window >= 2.5 * interval);
        if (!result.ok) expect(result.message).toContain(`${Number((result.minWindowMs / 1000).toFixed(3))} s`);
      }),
    );
  });

  it('guarantees two samples per window even with ±¼-interval jitter (property)', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1000, max: 120_000 }), // interval
        fc.array(fc.double({ min: -0.25, max: 0.25, noNaN: true }), { minLength: 40, maxLength: 40 }),
        fc.double({ min: 0, max: 1, noNaN: true }), // where the window ends
        fc.double({ min: 0, max: 2, noNaN: true }), // how much longer than the minimum
        (interval, jitter, endAt, extra) => {
          const samples = jitter.map((j, i) => ({ t: (i + j) * interval, v: i }));
          const window = minimumWindowMs(interval) + Math.round(extra * interval);
          // Keep the window inside the sampled span so a missing edge is not the cause.
          const end = interval + window + Math.round(endAt * (30 * interval - window));
          expect(checkWindow(window, interval).ok).toBe(true);
          expect(counterIncrease(samples, end - window, end)).not.toBeNull();
        },
      ),
    );
  });
});

describe('estimateSamplingInterval', () => {
  it('is the median gap, unmoved by one missed scrape', () => {
    const samples = [0, 15, 30, 45, 75, 90, 105].map((s) => ({ t: s * 1000, v: 0 }));
    expect(estimateSamplingInterval(samples)).toBe(15_000);
  });

  it('ignores duplicate timestamps and sorts its input', () => {
    const samples = [30, 0, 15, 15, 45].map((s) => ({ t: s * 1000, v: 0 }));
    expect(estimateSamplingInterval(samples)).toBe(15_000);
  });

  it('is null with fewer than two distinct timestamps', () => {
    expect(estimateSamplingInterval([])).toBeNull();
    expect(estimateSamplingInterval([{ t: 5, v: 1 }, { t: 5, v: 2 }])).toBeNull();
  });
});
