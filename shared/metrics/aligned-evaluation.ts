// Evaluates a window function at evenly spaced, epoch-aligned instants: the query API's core.
import { cumulativeIncrease } from './counter-increase';
import { firstIndexAfter, firstIndexAtOrAfter, sortedByTime, type Sample } from './sample';

/** Counter functions (increase, rate) and gauge functions (last, mean, min, max) over a window. */
export type WindowFunction = 'increase' | 'rate' | 'last' | 'mean' | 'min' | 'max';

export interface AlignedQuery {
  /** Range start, ms epoch (inclusive). */
  from: number;
  /** Range end, ms epoch (inclusive). */
  to: number;
  /** Distance between points, ms. */
  stepMs: number;
  /** Each point looks back over [t − windowMs, t]. */
  windowMs: number;
  fn: WindowFunction;
}

/** One evaluated instant; `v` is null where the window held too little data. */
export interface AlignedPoint {
  t: number;
  v: number | null;
}

/**
 * Upper bound on points per series. A chart cannot show more, and a typo in the step (1 ms over
 * a month) should fail fast instead of allocating billions of points in the server.
 */
export const MAX_ALIGNED_POINTS = 11_000;

/**
 * The instants to evaluate: every multiple of the step inside [from, to]. Aligning to multiples
 * of the step (rather than starting at `from`) puts every series, and every refresh of the same
 * chart, on the same timestamps, so points line up across series and cached results stay valid.
 */
export function alignedTimestamps(
  from: number,
  to: number,
  stepMs: number,
  maxPoints: number = MAX_ALIGNED_POINTS,
): number[] {
  if (!Number.isFinite(from) || !Number.isFinite(to) || from > to) {
    throw new RangeError(`range [${from}, ${to}] is not a valid time range`);
  }
  if (!Number.isFinite(stepMs) || stepMs <= 0) throw new RangeError(`step must be positive, got ${stepMs}`);
  const first = Math.ceil(from / stepMs) * stepMs;
  const count = first > to ? 0 : Math.floor((to - first) / stepMs) + 1;
  if (count > maxPoints) {
    throw new RangeError(`${count} points exceed the limit of ${maxPoints}; use a larger step`);
  }
  const out = new Array<number>(count);
  for (let i = 0; i < count; i++) out[i] = first + i * stepMs;
  return out;
}

/**
 * Evaluates `fn` over the trailing window at each aligned instant. Counter functions follow
 * counterIncrease/counterRate exactly (same reset handling, null under two samples) but use a
 * running total so a long range costs O(points · log n) rather than re-walking every window.
 * Gauge functions are null when the window holds no sample at all.
 */
export function evaluateAligned(samples: readonly Sample[], query: AlignedQuery): AlignedPoint[] {
  const { stepMs, windowMs, fn } = query;
  if (!Number.isFinite(windowMs) || windowMs <= 0) throw new RangeError(`window must be positive, got ${windowMs}`);
  const times = alignedTimestamps(query.from, query.to, stepMs);
  const sorted = sortedByTime(samples);
  const totals = fn === 'increase' || fn === 'rate' ? cumulativeIncrease(sorted) : null;
  return times.map((t) => {
    const start = firstIndexAtOrAfter(sorted, t - windowMs);
    const end = firstIndexAfter(sorted, t); // exclusive
    return { t, v: windowValue(sorted, totals, start, end, fn, windowMs) };
  });
}

function windowValue(
  sorted: readonly Sample[],
  totals: number[] | null,
  start: number,
  end: number,
  fn: WindowFunction,
  windowMs: number,
): number | null {
  if (totals) {
    if (end - start < 2) return null;
    const increase = totals[end - 1] - totals[start];
    return fn === 'rate' ? increase / (windowMs / 1000) : increase;
  }
  if (end <= start) return null;
  if (fn === 'last') return sorted[end - 1].v;
  let acc = fn === 'min' ? Infinity : fn === 'max' ? -Infinity : 0;
  for (let i = start; i < end; i++) {
    const v = sorted[i].v;
    if (fn === 'min') acc = Math.min(acc, v);
    else if (fn === 'max') acc = Math.max(acc, v);
    else acc += v;
  }
  return fn === 'mean' ? acc / (end - start) : acc;
}

/**
 * Evaluates many series on the same instants, keeping each one's labels, so the result can go
 * straight into aggregateByLabels point by point.
 */
export function evaluateAlignedSeries<L>(
  series: ReadonlyArray<{ labels: L; samples: readonly Sample[] }>,
  query: AlignedQuery,
): Array<{ labels: L; points: AlignedPoint[] }> {
  return series.map((s) => ({ labels: s.labels, points: evaluateAligned(s.samples, query) }));
}
