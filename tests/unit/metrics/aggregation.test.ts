import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { mean as ssMean, sum as ssSum } from 'simple-statistics';
import { aggregateByLabels, type LabelledValue } from '../../../shared/metrics/aggregation';

const fleet: LabelledValue[] = [
  { labels: { instance: 'a1', zone: 'eu-1' }, value: 10 },
  { labels: { instance: 'a2', zone: 'eu-1' }, value: 30 },
  { labels: { instance: 'b1', zone: 'eu-2' }, value: 5 },
  { labels: { instance: 'b2', zone: 'eu-2' }, value: 7 },
  { labels: { instance: 'b3', zone: 'eu-2' }, value: 9 },
];

describe('aggregateByLabels', () => {
  it('keeps one group per instance when grouping by instance', () => {
    const out = aggregateByLabels(fleet, ['instance'], 'sum');
    expect(out).toHaveLength(5);
    expect(out[0]).toEqual({ labels: { instance: 'a1' }, value: 10, count: 1 });
  });

  it('rolls instances up to zones, dropping the instance label', () => {
    expect(aggregateByLabels(fleet, ['zone'], 'sum')).toEqual([
      { labels: { zone: 'eu-1' }, value: 40, count: 2 },
      { labels: { zone: 'eu-2' }, value: 21, count: 3 },
    ]);
    expect(aggregateByLabels(fleet, ['zone'], 'mean')).toEqual([
      { labels: { zone: 'eu-1' }, value: 20, count: 2 },
      { labels: { zone: 'eu-2' }, value: 7, count: 3 },
    ]);
  });

  it('gives one global group for an empty group-by', () => {
    expect(aggregateByLabels(fleet, [], 'sum')).toEqual([{ labels: {}, value: 61, count: 5 }]);
    expect(aggregateByLabels(fleet, [], 'mean')).toEqual([{ labels: {}, value: 61 / 5, count: 5 }]);
  });

  it('puts series missing a grouping label in the empty-value group', () => {
    const out = aggregateByLabels([...fleet, { labels: { instance: 'c1' }, value: 100 }], ['zone'], 'sum');
    expect(out[0]).toEqual({ labels: { zone: '' }, value: 100, count: 1 });
  });

  it('skips non-finite values instead of poisoning the group', () => {
    const out = aggregateByLabels([...fleet, { labels: { instance: 'a3', zone: 'eu-1' }, value: NaN }], ['zone'], 'mean');
    expect(out[0]).toEqual({ labels: { zone: 'eu-1' }, value: 20, count: 2 });
  });

  it('returns nothing for no series', () => {
    expect(aggregateByLabels([], ['zone'], 'sum')).toEqual([]);
  });

  it('matches simple-statistics sum and mean per group on random series (reference library)', () => {
    const seriesArb = fc.array(
      fc.record({
        labels: fc.record({ zone: fc.constantFrom('z1', 'z2', 'z3'), tier: fc.constantFrom('web', 'db') }),
        value: fc.double({ min: -1e6, max: 1e6, noNaN: true }),
      }),
      { minLength: 1, maxLength: 60 },
    );
    fc.assert(
      fc.property(seriesArb, fc.constantFrom<string[]>([], ['zone'], ['tier'], ['zone', 'tier'], ['tier', 'zone']), (series, by) => {
        for (const op of ['sum', 'mean'] as const) {
          const out = aggregateByLabels(series, by, op);
          expect(out.reduce((n, g) => n + g.count, 0)).toBe(series.length);
          for (const group of out) {
            const members = series
              .filter((s) => by.every((name) => s.labels[name as 'zone' | 'tier'] === group.labels[name]))
              .map((s) => s.value);
            expect(group.count).toBe(members.length);
            const expected = op === 'sum' ? ssSum(members) : ssMean(members);
            expect(group.value).toBeCloseTo(expected, 6);
          }
        }
      }),
    );
  });
});
