// The query API's arithmetic over fetched series, built only from shared/metrics (no I/O here):
// window functions per series, then aggregation per group at each aligned instant.
import {
  aggregateByLabels,
  alignedTimestamps,
  evaluateAligned,
  firstIndexAfter,
  firstIndexAtOrAfter,
  histogramIncrease,
  histogramQuantile,
  linearTrend,
  ratioOfIncreases,
  sameBounds,
  shareAbove,
  timeToThreshold,
  type AggregationOp,
  type HistogramBuckets,
  type HistogramPoint,
  type Sample,
  type WindowFunction,
} from '../../shared/metrics';
import type { QueryPoint } from '../../shared/schemas/signals';

export interface SeriesData<P> {
  id: number;
  labels: Record<string, string>;
  data: P[];
}

export interface Grouping {
  /** null: every series is its own group (no aggregation). */
  by: string[] | null;
  op: AggregationOp;
}

export interface Frame {
  from: number;
  to: number;
  stepMs: number;
  windowMs: number;
}

export interface GroupResult {
  labels: Record<string, string>;
  seriesIds: number[];
  points: QueryPoint[];
}

/** The labels a series contributes to its group, and the group's identity. */
function groupLabels(labels: Record<string, string>, by: string[] | null): Record<string, string> {
  if (by === null) return labels;
  const out: Record<string, string> = {};
  for (const name of [...new Set(by)].sort()) out[name] = labels[name] ?? '';
  return out;
}
const groupKey = (labels: Record<string, string>) => JSON.stringify(Object.entries(labels).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));

export function groupsOf<P>(series: SeriesData<P>[], by: string[] | null): Map<string, { labels: Record<string, string>; members: SeriesData<P>[] }> {
  const groups = new Map<string, { labels: Record<string, string>; members: SeriesData<P>[] }>();
  for (const s of series) {
    const labels = by === null ? { ...s.labels, __series: String(s.id) } : groupLabels(s.labels, by);
    const key = groupKey(labels);
    const g = groups.get(key);
    if (g) g.members.push(s);
    else groups.set(key, { labels: by === null ? s.labels : labels, members: [s] });
  }
  return new Map([...groups.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)));
}

/**
 * Combines per-series values of one group at each instant with aggregateByLabels (sum or mean).
 * A series with no value at an instant (too few samples in its window) is left out; a group with
 * no value at all stays null.
 */
function combine(perSeries: Array<Array<number | null>>, times: number[], op: AggregationOp): Array<number | null> {
  return times.map((_, i) => {
    const values = [];
    for (const s of perSeries) {
      const v = s[i];
      if (v !== null && v !== undefined) values.push({ labels: {}, value: v });
    }
    if (values.length === 0) return null;
    return aggregateByLabels(values, [], op)[0]?.value ?? null;
  });
}

/** last, mean, min, max (gauges and counters) and increase, rate (counters). */
export function evaluateWindowFunction(series: SeriesData<Sample>[], fn: WindowFunction, frame: Frame, grouping: Grouping): GroupResult[] {
  const times = alignedTimestamps(frame.from, frame.to, frame.stepMs);
  const query = { from: frame.from, to: frame.to, stepMs: frame.stepMs, windowMs: frame.windowMs, fn };
  return [...groupsOf(series, grouping.by).values()].map((g) => {
    const perSeries = g.members.map((s) => evaluateAligned(s.data, query).map((p) => p.v));
    const values = combine(perSeries, times, grouping.op);
    return { labels: g.labels, seriesIds: g.members.map((s) => s.id), points: times.map((t, i) => ({ t, v: values[i]! })) };
  });
}

/**
 * Δnumerator / Δdenominator per group over each window. A denominator that did not grow is
 * "no traffic", never 0 %. A group with no numerator series at all counts zero numerator growth:
 * OpenTelemetry creates a counter's series at its first increment, so an error counter that never
 * fired has no series. A numerator series that exists but lacks samples in the window gives null.
 */
export function evaluateRatio(numerator: SeriesData<Sample>[], denominator: SeriesData<Sample>[], frame: Frame, by: string[]): GroupResult[] {
  const grouping: Grouping = { by, op: 'sum' };
  const num = new Map(evaluateWindowFunction(numerator, 'increase', frame, grouping).map((g) => [groupKey(g.labels), g]));
  const den = evaluateWindowFunction(denominator, 'increase', frame, grouping);
  return den.map((d) => {
    const n = num.get(groupKey(d.labels));
    return {
      labels: d.labels,
      seriesIds: [...(n?.seriesIds ?? []), ...d.seriesIds],
      points: d.points.map((p, i) => {
        if (p.v === null) return { t: p.t, v: null };
        const nv = n ? n.points[i]!.v : 0;
        if (nv === null) return { t: p.t, v: null };
        const r = ratioOfIncreases(nv, p.v);
        return r.kind === 'no_traffic' ? { t: p.t, v: null, noTraffic: true as const } : { t: p.t, v: r.value };
      }),
    };
  });
}

/** Window [t − window, t] of time-sorted points, by binary search. */
function windowSlice<P extends { t: number }>(points: P[], t: number, windowMs: number): P[] {
  const start = firstIndexAtOrAfter(points as unknown as Sample[], t - windowMs);
  const end = firstIndexAfter(points as unknown as Sample[], t);
  return points.slice(start, end);
}

export type HistogramFunction = { fn: 'quantile'; q: number } | { fn: 'share_above'; bound: number };

/**
 * Growth of every histogram in the group over each window, bucket counts summed across series,
 * then the quantile (grouped-data interpolation) or the share above a bound. Series whose bucket
 * layout differs from the group's first are left out and reported, since their counts cannot be
 * added bucket by bucket.
 */
export function evaluateHistogram(series: SeriesData<HistogramPoint>[], f: HistogramFunction, frame: Frame, by: string[] | null, warnings: string[]): GroupResult[] {
  const times = alignedTimestamps(frame.from, frame.to, frame.stepMs);
  let skipped = 0;
  const out = [...groupsOf(series, by).values()].map((g) => ({
    labels: g.labels,
    seriesIds: g.members.map((s) => s.id),
    points: times.map((t) => {
      let total: HistogramBuckets | null = null;
      for (const s of g.members) {
        const inc = histogramIncrease(windowSlice(s.data, t, frame.windowMs), t - frame.windowMs, t);
        if (!inc) continue;
        if (!total) total = { bounds: inc.bounds, counts: [...inc.counts] };
        else if (!sameBounds(total.bounds, inc.bounds)) skipped++;
        else total = { bounds: total.bounds, counts: total.counts.map((c, i) => c + inc.counts[i]!) };
      }
      if (!total) return { t, v: null };
      return { t, v: f.fn === 'quantile' ? histogramQuantile(f.q, total) : shareAbove(f.bound, total) };
    }),
  }));
  if (skipped) warnings.push(`${skipped} window(s) of series with a different bucket layout were left out of their group`);
  return out;
}

/**
 * Least-squares slope (per second) over each window per series, summed or averaged per group,
 * with the fitted level at t and, given a limit, the seconds until that level reaches it at the
 * current slope.
 */
export function evaluateTrend(series: SeriesData<Sample>[], frame: Frame, grouping: Grouping, limit: number | undefined): GroupResult[] {
  const times = alignedTimestamps(frame.from, frame.to, frame.stepMs);
  return [...groupsOf(series, grouping.by).values()].map((g) => {
    const fits = g.members.map((s) =>
      times.map((t) => {
        const pts = windowSlice(s.data, t, frame.windowMs).map((p) => ({ x: (p.t - t) / 1000, y: p.v }));
        return linearTrend(pts);
      }),
    );
    const slopes = combine(fits.map((f) => f.map((x) => x?.slope ?? null)), times, grouping.op);
    const levels = combine(fits.map((f) => f.map((x) => x?.intercept ?? null)), times, grouping.op);
    return {
      labels: g.labels,
      seriesIds: g.members.map((s) => s.id),
      points: times.map((t, i) => {
        const v = slopes[i]!;
        const level = levels[i]!;
        const p: QueryPoint = { t, v, level };
        if (limit !== undefined) p.timeToLimitSeconds = v === null || level === null ? null : timeToThreshold(level, v, limit);
        return p;
      }),
    };
  });
}
