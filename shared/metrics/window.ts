// The minimum evaluation window for a series, and an estimate of how often it is sampled.
import { median, sortedByTime, type Sample } from './sample';

/**
 * A window must span at least this many sampling intervals. Common practice (no published
 * source): at 2.5 intervals a window holds two samples or more wherever it falls, even when
 * each sample drifts up to a quarter interval from its slot, so a rate over a live series never
 * silently turns into "no data".
 */
export const MIN_WINDOW_INTERVALS = 2.5;

export type WindowCheck = { ok: true } | { ok: false; minWindowMs: number; message: string };

/** The smallest valid window (ms) for a sampling interval, rounded up to a whole millisecond. */
export function minimumWindowMs(intervalMs: number): number {
  if (!Number.isFinite(intervalMs) || intervalMs <= 0) {
    throw new RangeError(`sampling interval must be a positive number of ms, got ${intervalMs}`);
  }
  return Math.ceil(MIN_WINDOW_INTERVALS * intervalMs);
}

/** Seconds with at most three decimals and no trailing zeros, for messages people read. */
function formatSeconds(ms: number): string {
  return String(Number((ms / 1000).toFixed(3)));
}

/**
 * Accepts a window or explains the smallest one that works. The message names the minimum in
 * seconds because rule editors and the query form both speak seconds, and the person needs the
 * number to fix the input rather than a bare "too short".
 */
export function checkWindow(windowMs: number, intervalMs: number): WindowCheck {
  const minWindowMs = minimumWindowMs(intervalMs);
  if (Number.isFinite(windowMs) && windowMs >= minWindowMs) return { ok: true };
  return {
    ok: false,
    minWindowMs,
    message:
      `window must be at least ${formatSeconds(minWindowMs)} s ` +
      `(${MIN_WINDOW_INTERVALS} × the ${formatSeconds(intervalMs)} s sampling interval)`,
  };
}

/**
 * Sampling interval of a series as the median gap between consecutive samples. The median, not
 * the mean, so a few missed scrapes or a burst of duplicates do not move the estimate. Null
 * with fewer than two distinct timestamps (nothing to measure).
 */
export function estimateSamplingInterval(samples: readonly Sample[]): number | null {
  const sorted = sortedByTime(samples);
  const gaps: number[] = [];
  for (let i = 1; i < sorted.length; i++) {
    const gap = sorted[i].t - sorted[i - 1].t;
    // Zero gaps are duplicates (a retried push), not a sampling rate.
    if (gap > 0) gaps.push(gap);
  }
  return median(gaps);
}
