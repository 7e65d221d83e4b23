// Explicit-bucket histograms (the OTLP / Prometheus layout) and their validation.
import { z } from 'zod';

/**
 * Bucket layout as OTLP sends it: `bounds` are the finite upper bounds in increasing order and
 * `counts` has one more entry than `bounds`; bucket i holds observations in (bounds[i−1],
 * bounds[i]], the last one everything above the highest bound (+Inf). Counts are per bucket,
 * not cumulative.
 */
export interface HistogramBuckets {
  bounds: readonly number[];
  counts: readonly number[];
}

/** A histogram observed at one instant, with counts cumulative since the process started. */
export interface HistogramPoint extends HistogramBuckets {
  t: number;
}

/** Parses a bucket layout from the API so the maths below can rely on its shape. */
export const histogramBucketsSchema = z
  .object({
    bounds: z.array(z.number()),
    counts: z.array(z.number().min(0)),
  })
  .refine((h) => h.counts.length === h.bounds.length + 1, {
    message: 'counts must have one more entry than bounds (the last bucket is +Inf)',
    path: ['counts'],
  })
  .refine((h) => h.bounds.every((b, i) => i === 0 || b > h.bounds[i - 1]), {
    message: 'bounds must be strictly increasing',
    path: ['bounds'],
  });

/**
 * Throws on a malformed layout. Silent nonsense (a quantile from misaligned counts) is worse
 * than an error here, because the result would look like a plausible latency.
 */
export function assertHistogram(h: HistogramBuckets): void {
  if (h.counts.length !== h.bounds.length + 1) {
    throw new RangeError(`counts (${h.counts.length}) must have one more entry than bounds (${h.bounds.length})`);
  }
  for (let i = 0; i < h.bounds.length; i++) {
    if (!Number.isFinite(h.bounds[i])) throw new RangeError(`bound ${i} is not finite`);
    if (i > 0 && !(h.bounds[i] > h.bounds[i - 1])) throw new RangeError('bounds must be strictly increasing');
  }
  for (const c of h.counts) {
    if (!Number.isFinite(c) || c < 0) throw new RangeError(`bucket counts must be non-negative, got ${c}`);
  }
}

/** Total number of observations across all buckets. */
export function histogramTotal(h: HistogramBuckets): number {
  let n = 0;
  for (const c of h.counts) n += c;
  return n;
}

/**
 * Lower edge of finite bucket i. The first bucket starts at 0 when the lowest bound is
 * positive, because latencies and sizes cannot be negative; when the lowest bound is 0 or
 * negative the first bucket is unbounded below and this returns null (nothing to interpolate
 * against).
 */
export function bucketLowerBound(bounds: readonly number[], i: number): number | null {
  if (i > 0) return bounds[i - 1];
  return bounds.length > 0 && bounds[0] > 0 ? 0 : null;
}

/** True when both layouts have the same bounds, i.e. their counts can be added or subtracted. */
export function sameBounds(a: readonly number[], b: readonly number[]): boolean {
  return a.length === b.length && a.every((x, i) => x === b[i]);
}
