import { describe, it, expect } from 'vitest';
import {
  MULTI_WINDOW_POLICY,
  SLO_PERIOD_30D_MS,
  budgetConsumed,
  burnRate,
  burnRateForBudgetShare,
  burnRateThresholds,
  errorBudget,
  errorRatioForBurnRate,
  multiWindowBurnAlert,
  shortWindowFor,
  timeToExhaustion,
} from '../../../shared/stats/burn-rate';

// Source for every value here: "Alerting on SLOs", chapter 5 of The Site Reliability Workbook
// (O'Reilly, 2018), as quoted in REFERENCES.md.
const MIN = 60_000;
const HOUR = 60 * MIN;
const DAY = 24 * HOUR;

describe('burn rate', () => {
  it('is the error ratio over the budget', () => {
    expect(errorBudget(0.999)).toBeCloseTo(0.001, 15);
    expect(burnRate(0.001, 0.999)).toBeCloseTo(1, 12);
    expect(burnRate(0.0144, 0.999)).toBeCloseTo(14.4, 10);
  });

  it('spends 2 % of a 30-day budget in 1 h at burn 14.4 (Workbook: 14.4 × 1 h / 720 h)', () => {
    expect(SLO_PERIOD_30D_MS).toBe(720 * HOUR);
    expect(budgetConsumed(14.4, HOUR, SLO_PERIOD_30D_MS)).toBeCloseTo(0.02, 15);
    expect(burnRateForBudgetShare(0.02, HOUR, SLO_PERIOD_30D_MS)).toBeCloseTo(14.4, 12);
  });

  it.each([
    // Workbook Table 5-4 (99.9 % objective, 30 days): burn → error ratio → time to exhaustion.
    [1, 0.001, 30 * DAY],
    [2, 0.002, 15 * DAY],
    [10, 0.01, 3 * DAY],
    [1000, 1, 43.2 * MIN], // printed as 43 min; 43.2 = 0.001 × 43 200 min (arithmetic)
  ])('Table 5-4: burn %d → %f errors → exhausted after %d ms', (rate, errors, exhaustion) => {
    expect(errorRatioForBurnRate(rate, 0.999)).toBeCloseTo(errors, 12);
    expect(burnRate(errors, 0.999)).toBeCloseTo(rate, 9);
    expect(timeToExhaustion(rate, SLO_PERIOD_30D_MS)).toBeCloseTo(exhaustion, 3);
  });

  it('derives the Table 5-8 thresholds 14.4, 6 and 1 for 30 days, short window 1/12 of the long', () => {
    const rows = burnRateThresholds(SLO_PERIOD_30D_MS);
    expect(rows.map((r) => r.severity)).toEqual(['page', 'page', 'ticket']);
    expect(rows.map((r) => r.longWindowMs)).toEqual([HOUR, 6 * HOUR, 3 * DAY]);
    expect(rows.map((r) => r.shortWindowMs)).toEqual([5 * MIN, 30 * MIN, 6 * HOUR]);
    expect(rows.map((r) => r.budgetShare)).toEqual([0.02, 0.05, 0.1]);
    expect(rows[0].burnRate).toBeCloseTo(14.4, 12);
    expect(rows[1].burnRate).toBeCloseTo(6, 12);
    expect(rows[2].burnRate).toBeCloseTo(1, 12);
    expect(MULTI_WINDOW_POLICY).toHaveLength(3);
    expect(shortWindowFor(HOUR)).toBe(5 * MIN);
  });

  it('needs burn 36 to spend 5 % of the budget in 1 h (Workbook worked number)', () => {
    expect(burnRateForBudgetShare(0.05, HOUR, SLO_PERIOD_30D_MS)).toBeCloseTo(36, 12);
  });

  it('uses 0.02 % of the budget for 0.1 % errors over 10 min at 99.9 % (Workbook worked number)', () => {
    const share = budgetConsumed(burnRate(0.001, 0.999), 10 * MIN, SLO_PERIOD_30D_MS);
    expect((share * 100).toFixed(2)).toBe('0.02'); // exactly 10 / 43 200 = 0.0231 %
  });

  it('fires a multi-window alert only when both windows burn at the threshold', () => {
    expect(multiWindowBurnAlert(15, 20, 14.4)).toBe(true);
    expect(multiWindowBurnAlert(15, 3, 14.4)).toBe(false); // the problem already stopped
    expect(multiWindowBurnAlert(10, 20, 14.4)).toBe(false); // a short blip
    expect(multiWindowBurnAlert(null, 20, 14.4)).toBe(false);
  });

  it('has no exhaustion time at burn 0 and rejects impossible inputs', () => {
    expect(timeToExhaustion(0, SLO_PERIOD_30D_MS)).toBeNull();
    expect(() => errorBudget(1)).toThrow(RangeError);
    expect(() => burnRate(1.5, 0.999)).toThrow(RangeError);
    expect(() => budgetConsumed(1, 0, SLO_PERIOD_30D_MS)).toThrow(RangeError);
  });
});
