// One timestamped observation of a series, and the small helpers every window computation needs.
import { z } from 'zod';

/** One observation: `t` is milliseconds since the Unix epoch, `v` the value at that instant. */
export interface Sample {
  t: number;
  v: number;
}

/** Parses samples arriving from the API or a CSV so the computations can trust finite numbers. */
// zod 4's z.number() already rejects NaN and ±Infinity.
export const sampleSchema = z.object({
  t: z.number(),
  v: z.number(),
});

/**
 * Returns the samples ordered by time. Window maths walks samples in time order; stored samples
 * usually arrive sorted, so this only copies and sorts when they are not, keeping the common
 * path allocation-free.
 */
export function sortedByTime(samples: readonly Sample[]): readonly Sample[] {
  for (let i = 1; i < samples.length; i++) {
    if (samples[i].t < samples[i - 1].t) return [...samples].sort((a, b) => a.t - b.t);
  }
  return samples;
}

/**
 * Index of the first sample with `t >= time` in time-sorted samples (samples.length if none).
 * Binary search, because aligned evaluation asks this once per step over long series.
 */
export function firstIndexAtOrAfter(samples: readonly Sample[], time: number): number {
  let lo = 0;
  let hi = samples.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (samples[mid].t < time) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/** Index of the first sample with `t > time` in time-sorted samples (samples.length if none). */
export function firstIndexAfter(samples: readonly Sample[], time: number): number {
  let lo = 0;
  let hi = samples.length;
  while (lo < hi) {
    const mid = (lo + hi) >>> 1;
    if (samples[mid].t <= time) lo = mid + 1;
    else hi = mid;
  }
  return lo;
}

/**
 * Median of a list of numbers (null when empty). Kept here rather than in stats/ because the
 * interval estimate and the outlier score both need it and metrics must not depend on stats.
 */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}
