import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { counterRatio, ratioOfIncreases } from '../../../shared/metrics/error-ratio';
import { counterIncrease } from '../../../shared/metrics/counter-increase';

// Δerrors / Δrequests over one window is common practice (DESIGN.md §6); worked examples only.

const series = (values: number[]) => values.map((v, i) => ({ t: i * 15_000, v }));

describe('ratioOfIncreases', () => {
  it('divides when there was traffic', () => {
    expect(ratioOfIncreases(5, 200)).toEqual({ kind: 'value', value: 0.025 });
    expect(ratioOfIncreases(0, 200)).toEqual({ kind: 'value', value: 0 });
  });

  it('reports no traffic, never 0, when there were no requests', () => {
    expect(ratioOfIncreases(0, 0)).toEqual({ kind: 'no_traffic' });
  });

  it('rejects negative increases', () => {
    expect(() => ratioOfIncreases(-1, 10)).toThrow(RangeError);
    expect(() => ratioOfIncreases(1, NaN)).toThrow(RangeError);
  });
});

describe('counterRatio', () => {
  it('uses the growth of both counters over the same window', () => {
    const requests = series([1000, 1100, 1300, 1400]); // +400
    const errors = series([50, 52, 60, 70]); // +20
    expect(counterRatio(errors, requests, 0, 45_000)).toEqual({ kind: 'value', value: 0.05 });
    // Only the last two samples: 10 errors of 100 requests.
    expect(counterRatio(errors, requests, 30_000, 45_000)).toEqual({ kind: 'value', value: 0.1 });
  });

  it('handles a restart of both counters', () => {
    const requests = series([1000, 1100, 40, 140]); // 100 + 40 + 100 = 240
    const errors = series([50, 56, 0, 6]); // 6 + 0 + 6 = 12
    expect(counterRatio(errors, requests, 0, 45_000)).toEqual({ kind: 'value', value: 0.05 });
  });

  it('is no_traffic when the request counter did not move', () => {
    expect(counterRatio(series([3, 3, 3]), series([500, 500, 500]), 0, 30_000)).toEqual({ kind: 'no_traffic' });
  });

  it('is no_traffic without requests even if the error counter never reported', () => {
    // Error counters often appear only after the first error; with no requests none was possible.
    expect(counterRatio([], series([500, 500, 500]), 0, 30_000)).toEqual({ kind: 'no_traffic' });
  });

  it('is null (no data) when either counter has fewer than two samples', () => {
    expect(counterRatio(series([1, 2]), series([10]), 0, 30_000)).toBeNull();
    expect(counterRatio(series([1]), series([10, 20]), 0, 30_000)).toBeNull();
  });

  it('never reports a value for a window without requests (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.nat({ max: 1000 }), { minLength: 2, maxLength: 20 }),
        fc.array(fc.nat({ max: 1000 }), { minLength: 2, maxLength: 20 }),
        (errValues, reqValues) => {
          const errors = series(errValues);
          const requests = series(reqValues);
          const to = 20 * 15_000;
          const result = counterRatio(errors, requests, 0, to);
          const dRequests = counterIncrease(requests, 0, to);
          if (dRequests === 0) expect(result).toEqual({ kind: 'no_traffic' });
          else expect(result).toEqual({ kind: 'value', value: (counterIncrease(errors, 0, to) ?? NaN) / (dRequests ?? NaN) });
        },
      ),
    );
  });
});
