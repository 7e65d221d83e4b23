// Share of observations above a latency bound, read from histogram buckets.
import { assertHistogram, bucketLowerBound, histogramTotal, type HistogramBuckets } from './histogram';

/**
 * True when `bound` is one of the histogram's explicit bounds, i.e. shareAbove is exact for it.
 * Rule editors use this to warn that a threshold between bounds is only an estimate.
 */
export function isExplicitBound(bound: number, bounds: readonly number[]): boolean {
  return bounds.includes(bound);
}

/**
 * Fraction (0–1) of observations strictly above `bound`, e.g. "share of requests slower than
 * 300 ms". Exact when `bound` is one of the explicit bounds, since buckets are upper-inclusive.
 * Otherwise it is an estimate: inside the bucket that holds the bound the observations are
 * assumed to be spread evenly, so that bucket contributes the linearly interpolated part above
 * the bound (the same assumption as histogramQuantile). A bound inside an unbounded bucket
 * (above the highest bound, or below a non-positive lowest bound) counts that whole bucket as
 * above: nothing is known of where those observations sit, and over-reporting slowness is the
 * safer mistake for an alert. Null with no observations (no data, not 0 %).
 */
export function shareAbove(bound: number, histogram: HistogramBuckets): number | null {
  if (!Number.isFinite(bound)) throw new RangeError(`bound must be finite, got ${bound}`);
  assertHistogram(histogram);
  const { bounds, counts } = histogram;
  const total = histogramTotal(histogram);
  if (total === 0) return null;

  // First bucket whose upper bound is at or above the requested bound (the +Inf one if none).
  let i = 0;
  while (i < bounds.length && bounds[i] < bound) i++;

  let above = 0;
  for (let j = i + 1; j < counts.length; j++) above += counts[j];
  if (i < bounds.length && bounds[i] === bound) return above / total;

  const lower = i < bounds.length ? bucketLowerBound(bounds, i) : null;
  if (lower === null) {
    above += counts[i];
  } else {
    const upper = bounds[i];
    // Clamped because a bound below the first bucket's 0 edge has the whole bucket above it.
    const fractionAbove = Math.min(1, (upper - bound) / (upper - lower));
    above += counts[i] * fractionAbove;
  }
  return above / total;
}
