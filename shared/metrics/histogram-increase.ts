// Growth of a cumulative histogram between points and over a window, surviving resets.
import { assertHistogram, sameBounds, type HistogramBuckets, type HistogramPoint } from './histogram';

/**
 * Per-bucket growth from one cumulative histogram point to the next. If any bucket went down,
 * or the bucket layout changed, the process restarted (or was reconfigured) and all buckets
 * count again from zero, so the new counts themselves are the growth. The whole histogram is
 * treated as reset, not bucket by bucket, because a restart clears every bucket together;
 * mixing pre- and post-restart differences would invent observations.
 */
export function histogramDelta(previous: HistogramBuckets, next: HistogramBuckets): HistogramBuckets {
  assertHistogram(previous);
  assertHistogram(next);
  const reset =
    !sameBounds(previous.bounds, next.bounds) || next.counts.some((c, i) => c < previous.counts[i]);
  return {
    bounds: [...next.bounds],
    counts: reset ? [...next.counts] : next.counts.map((c, i) => c - previous.counts[i]),
  };
}

/**
 * Growth of a cumulative histogram over [from, to] (inclusive, ms epoch): the sum of
 * consecutive deltas of the points inside the window, the histogram counterpart of
 * counterIncrease (feed the result to histogramQuantile for a windowed latency quantile).
 * Null with fewer than two points (no data). When the layout changes inside the window, earlier
 * growth cannot be expressed in the new buckets, so the total restarts from that point (which
 * counts as a reset); the result always uses the last point's bounds.
 */
export function histogramIncrease(
  points: readonly HistogramPoint[],
  from: number,
  to: number,
): HistogramBuckets | null {
  if (!Number.isFinite(from) || !Number.isFinite(to) || from > to) {
    throw new RangeError(`window [${from}, ${to}] is not a valid time range`);
  }
  const inside = points.filter((p) => p.t >= from && p.t <= to).sort((a, b) => a.t - b.t);
  if (inside.length < 2) return null;
  let total: number[] | null = null;
  for (let i = 1; i < inside.length; i++) {
    const delta = histogramDelta(inside[i - 1], inside[i]);
    if (total === null || !sameBounds(inside[i - 1].bounds, inside[i].bounds)) {
      total = [...delta.counts];
    } else {
      for (let j = 0; j < total.length; j++) total[j] += delta.counts[j];
    }
  }
  return { bounds: [...inside[inside.length - 1].bounds], counts: total ?? [] };
}
