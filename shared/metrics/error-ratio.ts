// Ratio of two counters' growth over one window (errors / requests), with "no traffic" kept apart.
import { counterIncrease } from './counter-increase';
import type { Sample } from './sample';

/**
 * A ratio is either a number or the statement that nothing happened. Zero requests is not a
 * 0 % error ratio: treating it as 0 would make a dead service look perfect, so it has its own
 * kind that alert rules and charts must handle on purpose.
 */
export type RatioResult = { kind: 'value'; value: number } | { kind: 'no_traffic' };

/**
 * Ratio of two increases already computed over the same window. Negative inputs are rejected
 * because reset-aware increases can never be negative; one would mean a caller mixed raw
 * deltas in.
 */
export function ratioOfIncreases(numerator: number, denominator: number): RatioResult {
  if (!(numerator >= 0) || !(denominator >= 0)) {
    throw new RangeError(`increases must be non-negative, got ${numerator} / ${denominator}`);
  }
  if (denominator === 0) return { kind: 'no_traffic' };
  return { kind: 'value', value: numerator / denominator };
}

/**
 * Error ratio over [from, to]: growth of the numerator counter (e.g. errors) divided by growth
 * of the denominator counter (e.g. requests) in the same window, so both share the same edges.
 * Returns null when the denominator has no data (fewer than two samples): missing data is
 * different again from no traffic. A numerator series with no data while requests flowed
 * also gives null rather than assuming zero errors: an error counter that stopped reporting
 * must not read as a clean bill of health. With no requests the answer is no_traffic whatever
 * the numerator holds, since error counters often appear only after the first error.
 */
export function counterRatio(
  numerator: readonly Sample[],
  denominator: readonly Sample[],
  from: number,
  to: number,
): RatioResult | null {
  const requests = counterIncrease(denominator, from, to);
  if (requests === null) return null;
  if (requests === 0) return { kind: 'no_traffic' };
  const errors = counterIncrease(numerator, from, to);
  if (errors === null) return null;
  return ratioOfIncreases(errors, requests);
}
