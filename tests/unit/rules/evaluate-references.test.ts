// Each rule kind against an independent computation, with the source of every reference value.
import { describe, expect, it } from 'vitest';
import { evaluateRule } from '../../../shared/rules/evaluate-rule';
import { data, every, histSeries, rule, series, T0 } from './fixtures';

const relativeError = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('latency quantile rule', () => {
  it('reproduces the NCERT grouped-data median from two series, one of them reset', () => {
    // NCERT Mathematics Class X, ch. 14 "Statistics", Example 7 (printed): below 140: 4; 140–145: 7;
    // 145–150: 18; 150–155: 11; 155–160: 6; 160–165: 5; N = 51 → median = 145 + (25.5 − 11)/18 · 5 = 149.03.
    // The counts are split over two series of one group; series 1 restarts inside the window.
    const bounds = [140, 145, 150, 155, 160, 165];
    const a = histSeries(1, { instance: 'a' }, [
      { t: T0 - 200_000, bounds, counts: [10, 10, 10, 10, 10, 10, 0] },
      { t: T0 - 100_000, bounds, counts: [1, 1, 4, 2, 1, 1, 0] }, // restarted: everything counts anew
      { t: T0, bounds, counts: [2, 3, 9, 5, 3, 2, 0] },
    ]);
    const b = histSeries(2, { instance: 'b' }, [
      { t: T0 - 200_000, bounds, counts: [0, 0, 0, 0, 0, 0, 0] },
      { t: T0, bounds, counts: [2, 4, 9, 6, 3, 3, 0] },
    ]);
    const r = rule({ kind: 'latency_quantile', quantile: 0.5, op: '>', threshold: 149, window: 300 });
    const [g] = evaluateRule(r, data({ signalKind: 'histogram', histograms: [a, b] }), T0);
    expect(g!.observation).toMatchObject({ kind: 'value', firing: true });
    const v = g!.observation.kind === 'value' ? g!.observation.value! : NaN;
    expect(v).toBeCloseTo(149.03, 2); // printed value
    expect(v).toBeCloseTo(145 + ((25.5 - 11) / 18) * 5, 12); // the printed formula, evaluated
    expect(g!.detail.observations).toBe(51);

    // Share above 150 on the same data, exact because 150 is a bucket bound: (11 + 6 + 5) / 51.
    const share = rule({ kind: 'latency_share', bound: 150, op: '>=', threshold: 0.5, window: 300 });
    const [s] = evaluateRule(share, data({ signalKind: 'histogram', histograms: [a, b] }), T0);
    expect(s!.observation).toEqual({ kind: 'value', value: 22 / 51, firing: false });
  });

  it('reports no traffic when no request was observed in the window, and no data without points', () => {
    const bounds = [0.1, 0.5];
    const idle = histSeries(1, {}, [
      { t: T0 - 60_000, bounds, counts: [5, 1, 0] },
      { t: T0, bounds, counts: [5, 1, 0] },
    ]);
    const r = rule({ kind: 'latency_quantile', quantile: 0.99, op: '>', threshold: 0.3 });
    expect(evaluateRule(r, data({ signalKind: 'histogram', histograms: [idle] }), T0)[0]!.observation).toEqual({ kind: 'no_data', reason: 'no_traffic' });
    expect(evaluateRule(r, data({ signalKind: 'histogram', histograms: [idle] }), T0 + 3_600_000)[0]!.observation).toEqual({ kind: 'no_data', reason: 'no_data' });
  });
});

describe('time to limit rule', () => {
  /**
   * NIST StRD linear least squares "Norris" (x, y) in file order, as typed in and checked in
   * tests/unit/metrics/linear-trend.test.ts. Here x becomes seconds after T0 and y the gauge value.
   */
  const NORRIS: ReadonlyArray<readonly [x: number, y: number]> = [
    [0.2, 0.1], [337.4, 338.8], [118.2, 118.1], [884.6, 888.0], [10.1, 9.2], [226.5, 228.1],
    [666.3, 668.5], [996.3, 998.5], [448.6, 449.1], [777.0, 778.9], [558.2, 559.2], [0.4, 0.3],
    [0.6, 0.1], [775.5, 778.1], [666.9, 668.8], [338.0, 339.3], [447.5, 448.9], [11.6, 10.8],
    [556.0, 557.7], [228.1, 228.3], [995.8, 998.0], [887.6, 888.8], [120.2, 119.6], [0.3, 0.3],
    [0.3, 0.6], [556.8, 557.6], [339.1, 339.3], [887.2, 888.0], [999.0, 998.5], [779.0, 778.9],
    [11.1, 10.2], [118.3, 117.6], [229.2, 228.9], [669.1, 668.4], [448.9, 449.2], [0.5, 0.2],
  ];
  // Certified values, NIST StRD Norris: slope 1.00211681802045, intercept −0.262323073774029.
  const SLOPE = 1.00211681802045;
  const INTERCEPT = -0.262323073774029;

  it('forecasts with the NIST StRD Norris certified slope and intercept', () => {
    const s = series(1, {}, NORRIS.map(([x, y]) => ({ t: T0 + Math.round(x * 1000), v: y })));
    const now = T0 + 1_000_000; // x = 1000 s
    // Level now and seconds to 1100 from the certified line (arithmetic on the certified values).
    const level = INTERCEPT + SLOPE * 1000;
    const seconds = (1100 - level) / SLOPE; // ≈ 97.94 s
    const r = rule({ kind: 'time_to_limit', limit: 1100, direction: 'above', horizon: 100, window: 1000 });
    const [g] = evaluateRule(r, data({ series: [s] }), now);
    expect(relativeError(g!.detail.slope!, SLOPE)).toBeLessThan(1e-9);
    expect(relativeError(g!.detail.level!, level)).toBeLessThan(1e-9);
    expect(g!.observation.kind === 'value' && g!.observation.firing).toBe(true);
    expect(relativeError(g!.observation.kind === 'value' ? g!.observation.value! : NaN, seconds)).toBeLessThan(1e-9);

    // The same trend with a 90 s horizon does not reach the limit in time.
    const later = rule({ kind: 'time_to_limit', limit: 1100, direction: 'above', horizon: 90, window: 1000 });
    expect(evaluateRule(later, data({ series: [s] }), now)[0]!.observation).toMatchObject({ kind: 'value', firing: false });
    // Falling towards a limit below never happens on a rising line; already past a limit is 0 s.
    const below = rule({ kind: 'time_to_limit', limit: 0, direction: 'below', horizon: 3600, window: 1000 });
    expect(evaluateRule(below, data({ series: [s] }), now)[0]!.observation).toEqual({ kind: 'value', value: null, firing: false });
    const past = rule({ kind: 'time_to_limit', limit: 500, direction: 'above', horizon: 60, window: 1000 });
    expect(evaluateRule(past, data({ series: [s] }), now)[0]!.observation).toEqual({ kind: 'value', value: 0, firing: true });
  });

  it('sums the trends of a group (two disks filling at known rates)', () => {
    // Exact on synthetic data: 2 units/s and 3 units/s from 100 and 200 → 300 now, 5 units/s.
    const d1 = series(1, { host: 'h' }, every(15_000, T0 - 600_000, T0, (t) => 100 + (2 * (t - T0)) / 1000));
    const d2 = series(2, { host: 'h' }, every(15_000, T0 - 600_000, T0, (t) => 200 + (3 * (t - T0)) / 1000));
    const r = rule({ kind: 'time_to_limit', limit: 1000, direction: 'above', horizon: 3600, window: 600, groupBy: ['host'] });
    const [g] = evaluateRule(r, data({ series: [d1, d2] }), T0);
    expect(g!.labels).toEqual({ host: 'h' });
    expect(g!.detail.slope).toBeCloseTo(5, 9);
    expect(g!.detail.level).toBeCloseTo(300, 6);
    expect(g!.observation.kind === 'value' && g!.observation.value).toBeCloseTo(140, 6); // (1000 − 300) / 5
  });
});

describe('outlier rule', () => {
  /** Median and MAD written out here, independently of shared/metrics. */
  function referenceScores(values: number[]): number[] {
    const mid = (xs: number[]) => {
      const s = [...xs].sort((a, b) => a - b);
      return s.length % 2 ? s[(s.length - 1) / 2]! : (s[s.length / 2 - 1]! + s[s.length / 2]!) / 2;
    };
    const m = mid(values);
    const mad = mid(values.map((x) => Math.abs(x - m)));
    return values.map((x) => (0.6745 * (x - m)) / mad);
  }

  function members(x: number) {
    const values = [10, 11, 11, 12, 12, 10, x];
    return values.map((v, i) => series(i + 1, { zone: 'z1', instance: `i${i + 1}` }, every(15_000, T0 - 300_000, T0, () => v)));
  }

  it('flags a member whose modified z-score is above 3.5 and not one just below (Iglewicz & Hoaglin 1993, from memory)', () => {
    // Median 11, MAD 1: M = 0.6745 · (x − 11). x = 16.2 → 3.507 (flagged); x = 16.1 → 3.440 (not).
    const r = rule({ kind: 'outlier', memberLabel: 'instance', groupBy: ['zone'], window: 300 });
    const above = evaluateRule(r, data({ series: members(16.2) }), T0);
    const ref = referenceScores([10, 11, 11, 12, 12, 10, 16.2]);
    expect(above.map((g) => g.labels.instance)).toEqual(['i1', 'i2', 'i3', 'i4', 'i5', 'i6', 'i7']);
    above.forEach((g, i) => {
      expect(g.labels.zone).toBe('z1');
      expect(g.observation.kind === 'value' && g.observation.value).toBeCloseTo(ref[i]!, 12);
    });
    expect(ref[6]).toBeCloseTo(3.50740, 5);
    expect(above.filter((g) => g.observation.kind === 'value' && g.observation.firing).map((g) => g.labels.instance)).toEqual(['i7']);

    const below = evaluateRule(r, data({ series: members(16.1) }), T0);
    expect(referenceScores([10, 11, 11, 12, 12, 10, 16.1])[6]).toBeCloseTo(3.43995, 5);
    expect(below.some((g) => g.observation.kind === 'value' && g.observation.firing)).toBe(false);
  });

  it('looks only one way when asked, and needs at least three members with data', () => {
    const low = rule({ kind: 'outlier', memberLabel: 'instance', direction: 'below', window: 300 });
    expect(evaluateRule(low, data({ series: members(16.2) }), T0).some((g) => g.observation.kind === 'value' && g.observation.firing)).toBe(false);
    const two = members(50).slice(0, 2);
    const r = rule({ kind: 'outlier', memberLabel: 'instance', window: 300 });
    expect(evaluateRule(r, data({ series: two }), T0).map((g) => g.observation)).toEqual([
      { kind: 'no_data', reason: 'too_few_peers' },
      { kind: 'no_data', reason: 'too_few_peers' },
    ]);
  });

  it('compares counters by their rates', () => {
    const rates = [1, 1, 1, 1, 9];
    const s = rates.map((r, i) => series(i + 1, { instance: `i${i}` }, every(15_000, T0 - 300_000, T0, (t) => (r * (t - (T0 - 300_000))) / 1000)));
    const r = rule({ kind: 'outlier', memberLabel: 'instance', window: 300 });
    const out = evaluateRule(r, data({ signalKind: 'counter', series: s }), T0);
    // MAD = 0 here (most members equal): the mean-absolute-deviation fallback still flags the 9.
    expect(out.filter((g) => g.observation.kind === 'value' && g.observation.firing).map((g) => g.labels.instance)).toEqual(['i4']);
    expect(out[4]!.detail.memberValue).toBeCloseTo(9, 9);
  });
});

describe('threshold, rate of change and share rules on synthetic data (exact)', () => {
  it('threshold: the mean over the window per series, averaged over the group', () => {
    const a = series(1, { zone: 'a', instance: '1' }, every(15_000, T0 - 600_000, T0, (_t, i) => i)); // 0..40
    const b = series(2, { zone: 'a', instance: '2' }, every(15_000, T0 - 600_000, T0, () => 100));
    const r = rule({ kind: 'threshold', window: 150, groupBy: ['zone'], op: '>', threshold: 60, aggregation: 'mean', combine: 'mean' });
    const [g] = evaluateRule(r, data({ series: [a, b] }), T0);
    // Window [T0 − 150 s, T0] holds the last 11 samples of a: 30..40, mean 35; b is 100 → (35 + 100) / 2.
    expect(g!.observation).toEqual({ kind: 'value', value: 67.5, firing: true });
    const last = rule({ kind: 'threshold', window: 150, op: '<', threshold: 41, aggregation: 'last', combine: 'sum' });
    expect(evaluateRule(last, data({ series: [a] }), T0)[0]!.observation).toEqual({ kind: 'value', value: 40, firing: true });
    expect(evaluateRule(last, data({ series: [a] }), T0 + 3_600_000)[0]!.observation).toEqual({ kind: 'no_data', reason: 'no_data' });
  });

  it('rate of change: a counter growing as 0.25·s² accelerates at 0.5/s²', () => {
    // Rate over [s − w, s] of 0.25·s² is 0.25·(2s − w); two consecutive windows differ by 0.5·w → 0.5/s².
    const start = T0 - 1_200_000;
    const c = series(1, {}, every(15_000, start, T0, (t) => 0.25 * ((t - start) / 1000) ** 2));
    const r = rule({ kind: 'rate_of_change', window: 300, op: '>', threshold: 0.4 });
    const [g] = evaluateRule(r, data({ signalKind: 'counter', series: [c] }), T0);
    expect(g!.observation.kind === 'value' && g!.observation.value).toBeCloseTo(0.5, 9);
    expect(g!.observation.kind === 'value' && g!.observation.firing).toBe(true);
    expect(g!.detail.rate).toBeCloseTo(0.25 * (2 * 1200 - 300), 6);
    const steady = series(1, {}, every(15_000, start, T0, (t) => (t - start) / 100));
    expect(evaluateRule(r, data({ signalKind: 'counter', series: [steady] }), T0)[0]!.observation).toMatchObject({ kind: 'value', value: 0, firing: false });
  });

  it('share above a bound between bucket bounds interpolates inside the bucket', () => {
    // 100 observations: 50 ≤ 0.1 s, 30 in (0.1, 0.5], 20 in (0.5, 1]. Above 0.3: half of the 30 + 20 = 35 %.
    const bounds = [0.1, 0.5, 1];
    const h = histSeries(1, {}, [
      { t: T0 - 60_000, bounds, counts: [0, 0, 0, 0] },
      { t: T0, bounds, counts: [50, 30, 20, 0] },
    ]);
    const r = rule({ kind: 'latency_share', bound: 0.3, op: '>', threshold: 0.3 });
    const [g] = evaluateRule(r, data({ signalKind: 'histogram', histograms: [h] }), T0);
    expect(g!.observation.kind === 'value' && g!.observation.value).toBeCloseTo(0.35, 12);
  });
});
