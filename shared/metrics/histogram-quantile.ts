// Quantile estimate from explicit histogram buckets by the grouped-data percentile formula.
import { assertHistogram, bucketLowerBound, histogramTotal, type HistogramBuckets } from './histogram';

/**
 * Estimates the p-quantile (0 ≤ p ≤ 1) of the observations behind a histogram. Only bucket
 * counts survive aggregation, so the textbook grouped-data percentile is used: find the bucket
 * holding rank p·N and interpolate linearly inside it, L + ((p·N − F) / f) · w (L its lower
 * bound, F the count below it, f its count, w its width), which assumes observations are spread
 * evenly inside a bucket. The error is therefore at most one bucket width.
 *
 * Edge rules:
 * - the lowest bucket starts at 0 when the bounds are positive (latencies are never negative);
 *   if the lowest bound is ≤ 0 that bucket has no lower edge and its upper bound is returned;
 * - a rank that falls in the +Inf bucket returns the highest finite bound: nothing is known
 *   about how far above it those observations are, so the answer is a lower estimate, and the
 *   caller should read "≥ highest bound" (choose bounds that cover the range you alert on);
 * - with no observations, or no finite bound at all, the answer is null (no data), never 0.
 */
export function histogramQuantile(p: number, histogram: HistogramBuckets): number | null {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile must be within [0, 1], got ${p}`);
  assertHistogram(histogram);
  const { bounds, counts } = histogram;
  const total = histogramTotal(histogram);
  if (total === 0 || bounds.length === 0) return null;
  const rank = p * total;
  let below = 0;
  for (let i = 0; i < counts.length; i++) {
    const f = counts[i];
    // Skip empty buckets so p = 0 lands on the first bucket that holds anything.
    if (f > 0 && below + f >= rank) {
      if (i === bounds.length) return bounds[bounds.length - 1];
      const upper = bounds[i];
      const lower = bucketLowerBound(bounds, i);
      if (lower === null) return upper;
      return lower + ((rank - below) / f) * (upper - lower);
    }
    below += f;
  }
  // Only reachable through rounding when p·N exceeds the summed counts by an ulp.
  return counts[bounds.length] > 0 ? bounds[bounds.length - 1] : lastNonEmptyUpper(histogram);
}

function lastNonEmptyUpper({ bounds, counts }: HistogramBuckets): number {
  for (let i = bounds.length - 1; i >= 0; i--) if (counts[i] > 0) return bounds[i];
  return bounds[bounds.length - 1];
}
