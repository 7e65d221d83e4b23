// User satisfaction index: one 0–1 number for how response times feel (Apdex-style formula).

export type SatisfactionZone = 'satisfied' | 'tolerating' | 'frustrated';

export interface SatisfactionCounts {
  satisfied: number;
  tolerating: number;
  frustrated: number;
}

/** Tolerating extends to this multiple of the threshold T (Apdex Technical Specification). */
export const TOLERATING_FACTOR = 4;

/**
 * Zone of one response time for threshold T: satisfied at or below T, tolerating at or below
 * 4T, frustrated above. The boundary values belong to the better zone (from memory of the
 * specification; REFERENCES.md asks for the edge to be tested). A response without a finite
 * time (failed, timed out) is frustrated: the user waited and got nothing.
 */
export function satisfactionZone(latencyMs: number, thresholdMs: number): SatisfactionZone {
  if (!(thresholdMs > 0) || !Number.isFinite(thresholdMs)) {
    throw new RangeError(`threshold must be a positive number of ms, got ${thresholdMs}`);
  }
  if (!Number.isFinite(latencyMs)) return 'frustrated';
  if (latencyMs <= thresholdMs) return 'satisfied';
  if (latencyMs <= TOLERATING_FACTOR * thresholdMs) return 'tolerating';
  return 'frustrated';
}

/** Counts response times per zone. */
export function satisfactionCounts(latenciesMs: readonly number[], thresholdMs: number): SatisfactionCounts {
  const counts: SatisfactionCounts = { satisfied: 0, tolerating: 0, frustrated: 0 };
  for (const latency of latenciesMs) counts[satisfactionZone(latency, thresholdMs)] += 1;
  return counts;
}

/**
 * (satisfied + tolerating / 2) / total. A tolerating response counts half: slow enough to
 * notice, not enough to give up. Null with no responses, since an empty period is not a
 * score of 0 or 1. Takes counts so failed runs counted elsewhere can be added as frustrated.
 */
export function satisfactionIndexFromCounts(counts: SatisfactionCounts): number | null {
  const { satisfied, tolerating, frustrated } = counts;
  for (const c of [satisfied, tolerating, frustrated]) {
    if (!Number.isFinite(c) || c < 0) throw new RangeError(`counts must be non-negative, got ${c}`);
  }
  const total = satisfied + tolerating + frustrated;
  return total === 0 ? null : (satisfied + tolerating / 2) / total;
}

/** Satisfaction index of a list of response times for threshold T (ms). */
export function satisfactionIndex(latenciesMs: readonly number[], thresholdMs: number): number | null {
  return satisfactionIndexFromCounts(satisfactionCounts(latenciesMs, thresholdMs));
}
