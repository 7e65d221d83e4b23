// How fast a rate itself is changing, and how long until a value at that pace crosses a limit.
import type { Sample } from './sample';

/**
 * Acceleration of a rate series: the difference of consecutive rates divided by the seconds
 * between them, stamped at the later point. A steadily climbing error rate is worth a page
 * before it crosses the threshold, and this is the derivative that shows the climb. Points with
 * a null or non-finite rate (no data) break the chain: no acceleration is reported across the
 * gap, because a rate compared with one from before an outage says nothing about the trend.
 * Input must be in time order; equal timestamps are skipped (no time passed, no derivative).
 */
export function rateOfChange(rates: ReadonlyArray<{ t: number; v: number | null }>): Sample[] {
  const out: Sample[] = [];
  for (let i = 1; i < rates.length; i++) {
    const a = rates[i - 1];
    const b = rates[i];
    if (a.v === null || b.v === null || !Number.isFinite(a.v) || !Number.isFinite(b.v)) continue;
    const seconds = (b.t - a.t) / 1000;
    if (!(seconds > 0)) continue;
    out.push({ t: b.t, v: (b.v - a.v) / seconds });
  }
  return out;
}

/**
 * Seconds until `value`, moving at `ratePerSecond`, reaches `limit`: (limit − value) / rate.
 * (DESIGN.md §6 writes (value − limit) / rate; the sign here is the one that gives a positive
 * time when the value approaches the limit.) Null when the value is moving away from the limit
 * or not moving (or so slowly the time overflows), since then it never gets there; 0 when it
 * is already at the limit.
 */
export function timeToThreshold(value: number, ratePerSecond: number, limit: number): number | null {
  if (![value, ratePerSecond, limit].every(Number.isFinite)) return null;
  const gap = limit - value;
  if (gap === 0) return 0;
  if (ratePerSecond === 0 || Math.sign(gap) !== Math.sign(ratePerSecond)) return null;
  const seconds = gap / ratePerSecond;
  // A rate so small that the time overflows is "never" for any practical purpose.
  return Number.isFinite(seconds) ? seconds : null;
}
