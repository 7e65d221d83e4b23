// Counter rate and error ratio rules as property tests (fast-check): random counters with resets,
// checked against the growth the generator itself produced (no source: common practice, DESIGN.md §6).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Sample } from '../../../shared/metrics';
import { evaluateRule } from '../../../shared/rules/evaluate-rule';
import { data, rule, series, T0 } from './fixtures';

const STEP = 15_000;

interface GeneratedCounter {
  samples: Sample[];
  /** True growth between sample i − 1 and sample i (what the process counted). */
  growth: number[];
}

/**
 * A counter sampled every 15 s ending at T0. A restart makes it count again from zero: the stored
 * value after a restart is what was counted since, kept below the value before so the restart is
 * visible in the data (an invisible one cannot be told apart from slow growth by anyone).
 */
const counterArb = (n: number) =>
  fc
    .array(fc.record({ inc: fc.nat({ max: 50 }), reset: fc.double({ min: 0, max: 1, noNaN: true }) }), { minLength: n, maxLength: n })
    .chain((steps) =>
      fc.nat({ max: 1000 }).map((start): GeneratedCounter => {
        const samples: Sample[] = [];
        const growth: number[] = [];
        let v = start;
        steps.forEach((s, i) => {
          const t = T0 - (n - 1 - i) * STEP;
          if (i === 0) {
            growth.push(0);
          } else if (s.reset < 0.1 && v > 0) {
            const counted = s.inc % v;
            growth.push(counted);
            v = counted;
          } else {
            growth.push(s.inc);
            v += s.inc;
          }
          samples.push({ t, v });
        });
        return { samples, growth };
      }),
    );

/** Growth inside [T0 − window, T0]: every step whose both samples lie in the window. */
function trueIncrease(c: GeneratedCounter, windowMs: number): number {
  let sum = 0;
  c.samples.forEach((s, i) => {
    if (i > 0 && c.samples[i - 1]!.t >= T0 - windowMs && s.t <= T0) sum += c.growth[i]!;
  });
  return sum;
}

describe('counter rate rule (property)', () => {
  it('equals the summed true growth of the group over the window, whatever the resets', () => {
    fc.assert(
      fc.property(counterArb(40), counterArb(40), fc.integer({ min: 3, max: 39 }), fc.double({ min: 0, max: 5, noNaN: true }), (a, b, steps, threshold) => {
        const windowS = (steps * STEP) / 1000;
        const r = rule({ kind: 'counter_rate', window: windowS, groupBy: ['zone'], op: '>', threshold });
        const [g] = evaluateRule(r, data({ signalKind: 'counter', series: [series(1, { zone: 'z', pod: 'a' }, a.samples), series(2, { zone: 'z', pod: 'b' }, b.samples)] }), T0);
        const expected = (trueIncrease(a, steps * STEP) + trueIncrease(b, steps * STEP)) / windowS;
        expect(g!.observation.kind).toBe('value');
        if (g!.observation.kind !== 'value') return;
        expect(g!.observation.value).toBeCloseTo(expected, 9);
        expect(g!.observation.firing).toBe(expected > threshold);
      }),
      { numRuns: 300 },
    );
  });
});

describe('error ratio rule (property)', () => {
  it('is Δerrors / Δrequests over the window with resets, and "no traffic" (never 0) without requests', () => {
    fc.assert(
      fc.property(counterArb(30), counterArb(30), fc.integer({ min: 3, max: 29 }), fc.double({ min: 0, max: 1, noNaN: true }), (errors, requests, steps, threshold) => {
        const windowMs = steps * STEP;
        const r = rule({ kind: 'error_ratio', window: windowMs / 1000, requestsSignal: 'requests', op: '>=', threshold });
        const [g] = evaluateRule(r, data({ signalKind: 'counter', series: [series(1, { code: '5xx' }, errors.samples)], requests: [series(2, {}, requests.samples)] }), T0);
        const req = trueIncrease(requests, windowMs);
        const err = trueIncrease(errors, windowMs);
        expect(g!.detail).toEqual({ errors: err, requests: req });
        if (req === 0) {
          expect(g!.observation).toEqual({ kind: 'no_data', reason: 'no_traffic' });
        } else {
          expect(g!.observation.kind).toBe('value');
          if (g!.observation.kind !== 'value') return;
          expect(g!.observation.value).toBeCloseTo(err / req, 12);
          expect(g!.observation.firing).toBe(err / req >= threshold);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('counts zero errors for a group with no error series, and no data when the requests have none', () => {
    const flat = (v0: number, perStep: number) => Array.from({ length: 21 }, (_, i) => ({ t: T0 - (20 - i) * STEP, v: v0 + i * perStep }));
    const r = rule({ kind: 'error_ratio', window: 300, requestsSignal: 'requests', groupBy: ['zone'], op: '>', threshold: 0.01 });
    const out = evaluateRule(
      r,
      data({
        signalKind: 'counter',
        series: [series(1, { zone: 'a' }, flat(0, 1))],
        requests: [series(2, { zone: 'a' }, flat(0, 10)), series(3, { zone: 'b' }, flat(0, 10)), series(4, { zone: 'c' }, [])],
      }),
      T0,
    );
    expect(out.map((g) => [g.labels.zone, g.observation])).toEqual([
      ['a', { kind: 'value', value: 0.1, firing: true }],
      ['b', { kind: 'value', value: 0, firing: false }],
      ['c', { kind: 'no_data', reason: 'no_data' }],
    ]);
  });
});
