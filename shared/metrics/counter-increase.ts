// Increase and per-second rate of a monotonic counter over a window, surviving counter resets.
import { firstIndexAfter, firstIndexAtOrAfter, sortedByTime, type Sample } from './sample';

/**
 * How much a counter grew between two consecutive samples. A counter only goes up, so a drop
 * means the process restarted and counted again from zero: everything it shows now was counted
 * after the restart, hence the new value itself is the growth (what happened between the last
 * sample before the restart and the restart itself is lost and not guessed).
 */
export function resetAwareDelta(previous: number, next: number): number {
  return next >= previous ? next - previous : next;
}

function assertWindow(from: number, to: number): void {
  if (!Number.isFinite(from) || !Number.isFinite(to) || from > to) {
    throw new RangeError(`window [${from}, ${to}] is not a valid time range`);
  }
}

/**
 * Running total of reset-aware growth: entry i is the growth from sample 0 to sample i. Growth
 * between any two samples is then one subtraction, which lets aligned evaluation answer every
 * step of a long range in O(log n) instead of re-walking the window each time, and guarantees
 * that adjacent windows add up exactly to the window spanning both.
 */
export function cumulativeIncrease(sortedSamples: readonly Sample[]): number[] {
  const totals = new Array<number>(sortedSamples.length);
  if (sortedSamples.length === 0) return totals;
  totals[0] = 0;
  for (let i = 1; i < sortedSamples.length; i++) {
    totals[i] = totals[i - 1] + resetAwareDelta(sortedSamples[i - 1].v, sortedSamples[i].v);
  }
  return totals;
}

/**
 * Growth of a counter over [from, to] (both ends inclusive, ms epoch): the sum of reset-aware
 * deltas between consecutive samples inside the window. Returns null, not 0, with fewer than
 * two samples, because one sample says nothing about growth and reporting 0 would look like a
 * healthy idle service. No extrapolation to the window edges: the value is what was observed.
 */
export function counterIncrease(samples: readonly Sample[], from: number, to: number): number | null {
  assertWindow(from, to);
  const sorted = sortedByTime(samples);
  const first = firstIndexAtOrAfter(sorted, from);
  const end = firstIndexAfter(sorted, to);
  if (end - first < 2) return null;
  let total = 0;
  for (let i = first + 1; i < end; i++) total += resetAwareDelta(sorted[i - 1].v, sorted[i].v);
  return total;
}

/**
 * Per-second rate of a counter over [from, to]: the increase divided by the window length in
 * seconds (the nominal window, so rates of windows of equal length compare directly even when
 * samples sit unevenly inside them). Null when the increase is null (no data).
 */
export function counterRate(samples: readonly Sample[], from: number, to: number): number | null {
  assertWindow(from, to);
  if (to === from) throw new RangeError('a rate needs a window longer than zero');
  const increase = counterIncrease(samples, from, to);
  return increase === null ? null : increase / ((to - from) / 1000);
}
