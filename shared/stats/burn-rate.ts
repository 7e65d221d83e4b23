// SLO error budgets and burn rates ("Alerting on SLOs", The Site Reliability Workbook, 2018).

const HOUR_MS = 3_600_000;
const DAY_MS = 24 * HOUR_MS;

/** The usual SLO period, 30 days, which the Workbook's tables assume. */
export const SLO_PERIOD_30D_MS = 30 * DAY_MS;

function assertObjective(objective: number): void {
  if (!(objective > 0 && objective < 1)) {
    throw new RangeError(`objective must be between 0 and 1 exclusive (e.g. 0.999), got ${objective}`);
  }
}

function assertPositive(name: string, value: number): void {
  if (!(value > 0) || !Number.isFinite(value)) throw new RangeError(`${name} must be positive, got ${value}`);
}

/** The error budget as a ratio: a 99.9 % objective allows 0.1 % of requests to fail. */
export function errorBudget(objective: number): number {
  assertObjective(objective);
  return 1 - objective;
}

/**
 * How fast the budget is being spent: observed error ratio / (1 − objective). 1 spends exactly
 * the budget over the period; 14.4 would spend a 30-day budget in 50 hours. Expressing alerts
 * in burn rate makes one threshold work for any objective.
 */
export function burnRate(errorRatio: number, objective: number): number {
  if (!(errorRatio >= 0 && errorRatio <= 1)) throw new RangeError(`error ratio must be within [0, 1], got ${errorRatio}`);
  return errorRatio / errorBudget(objective);
}

/** The error ratio that a given burn rate means for an objective (Workbook Table 5-4). */
export function errorRatioForBurnRate(rate: number, objective: number): number {
  if (!(rate >= 0)) throw new RangeError(`burn rate must be non-negative, got ${rate}`);
  return rate * errorBudget(objective);
}

/**
 * Share of the period's budget spent by burning at `rate` for `windowMs`: rate × window / period
 * (14.4 × 1 h / 720 h = 2 %). This is what an alert on that window has let slip by the time it
 * fires.
 */
export function budgetConsumed(rate: number, windowMs: number, periodMs: number): number {
  if (!(rate >= 0)) throw new RangeError(`burn rate must be non-negative, got ${rate}`);
  assertPositive('window', windowMs);
  assertPositive('period', periodMs);
  return (rate * windowMs) / periodMs;
}

/**
 * The burn rate that spends `budgetShare` of the budget in `windowMs`: share × period / window
 * (2 % of 30 days in 1 h → 14.4). Alert thresholds are chosen this way, from how much budget
 * one is willing to lose before being told.
 */
export function burnRateForBudgetShare(budgetShare: number, windowMs: number, periodMs: number): number {
  if (!(budgetShare > 0 && budgetShare <= 1)) throw new RangeError(`budget share must be within (0, 1], got ${budgetShare}`);
  assertPositive('window', windowMs);
  assertPositive('period', periodMs);
  return (budgetShare * periodMs) / windowMs;
}

/** Time until the whole budget is gone at a constant burn rate: period / rate; null at rate 0. */
export function timeToExhaustion(rate: number, periodMs: number): number | null {
  if (!(rate >= 0)) throw new RangeError(`burn rate must be non-negative, got ${rate}`);
  assertPositive('period', periodMs);
  return rate === 0 ? null : periodMs / rate;
}

/**
 * The short confirmation window for a long alert window: 1/12 of it (Workbook). The short window
 * lets an alert stop firing soon after the problem stops, instead of waiting out the long one.
 */
export function shortWindowFor(longWindowMs: number): number {
  assertPositive('long window', longWindowMs);
  return longWindowMs / 12;
}

export interface BurnRateAlertPolicy {
  severity: 'page' | 'ticket';
  longWindowMs: number;
  shortWindowMs: number;
  /** Share of the period's budget that may burn within the long window before this fires. */
  budgetShare: number;
}

/**
 * The Workbook's recommended multi-window, multi-burn-rate alerts (Table 5-8): page at 2 % of
 * the budget in 1 h, page at 5 % in 6 h, ticket at 10 % in 3 days.
 */
export const MULTI_WINDOW_POLICY: readonly BurnRateAlertPolicy[] = [
  { severity: 'page', longWindowMs: HOUR_MS, shortWindowMs: shortWindowFor(HOUR_MS), budgetShare: 0.02 },
  { severity: 'page', longWindowMs: 6 * HOUR_MS, shortWindowMs: shortWindowFor(6 * HOUR_MS), budgetShare: 0.05 },
  { severity: 'ticket', longWindowMs: 3 * DAY_MS, shortWindowMs: shortWindowFor(3 * DAY_MS), budgetShare: 0.1 },
];

/**
 * The policy's burn-rate thresholds for an SLO period: for 30 days they are 14.4, 6 and 1. Derived
 * rather than hard-coded so that a 7- or 28-day SLO gets thresholds that mean the same budget.
 */
export function burnRateThresholds(
  periodMs: number,
  policy: readonly BurnRateAlertPolicy[] = MULTI_WINDOW_POLICY,
): Array<BurnRateAlertPolicy & { burnRate: number }> {
  return policy.map((p) => ({ ...p, burnRate: burnRateForBudgetShare(p.budgetShare, p.longWindowMs, periodMs) }));
}

/**
 * A multi-window alert fires only when both the long and the short window burn at or above the
 * threshold: the long one proves the burn is significant, the short one that it is still
 * happening. A window without data (null) cannot confirm anything.
 */
export function multiWindowBurnAlert(longBurn: number | null, shortBurn: number | null, threshold: number): boolean {
  return longBurn !== null && shortBurn !== null && longBurn >= threshold && shortBurn >= threshold;
}
