// One rule evaluated at one instant over samples already loaded, per label group, built only from
// shared/metrics. The evaluator (live), replay (history) and alert detail all call this.
import {
  aggregateByLabels,
  counterIncrease,
  counterRate,
  evaluateAligned,
  firstIndexAfter,
  firstIndexAtOrAfter,
  histogramIncrease,
  histogramQuantile,
  linearTrend,
  modifiedZScores,
  rateOfChange,
  ratioOfIncreases,
  sameBounds,
  shareAbove,
  timeToLimit,
  type AggregationOp,
  type HistogramBuckets,
  type HistogramPoint,
  type Sample,
} from '../metrics';
import type { SignalKind } from '../schemas/signals';
import { groupKey, groupLabels, type Labels } from './label-groups';
import { compare, type RuleDocument, type RuleOf } from './rule-schema';
import type { NoDataReason, Observation } from './state-machine';

export interface SampleSeries {
  id: number;
  labels: Labels;
  /** Time-ordered. */
  samples: readonly Sample[];
}

export interface HistogramSeries {
  id: number;
  labels: Labels;
  /** Time-ordered cumulative points. */
  points: readonly HistogramPoint[];
}

export interface RuleData {
  /** Kind of the rule's main signal (outlier rules treat gauges and counters differently). */
  signalKind: SignalKind;
  /** The main signal's series, when it is a counter or a gauge. */
  series: readonly SampleSeries[];
  /** The main signal's series, when it is a histogram. */
  histograms: readonly HistogramSeries[];
  /** error_ratio: the requests counter's series. */
  requests: readonly SampleSeries[];
}

export type EvaluationDetail = Record<string, number | null>;

export interface GroupEvaluation {
  key: string;
  labels: Labels;
  observation: Observation;
  /** Intermediate figures worth showing (the requests behind a ratio, a trend's slope...). */
  detail: EvaluationDetail;
}

/** Fewest members with data an outlier rule compares (with two, each is "as far" as the other). */
export const MIN_OUTLIER_PEERS = 3;

type Grouped<S> = Map<string, { labels: Labels; members: S[] }>;

function groupSeries<S extends { labels: Labels }>(series: readonly S[], by: readonly string[], into: Grouped<S> = new Map()): Grouped<S> {
  for (const s of series) {
    const labels = groupLabels(s.labels, by);
    const key = groupKey(labels);
    const g = into.get(key);
    if (g) g.members.push(s);
    else into.set(key, { labels, members: [s] });
  }
  return into;
}

/** Points in [from, to] of time-ordered points, by binary search (long replays call this a lot). */
function slice<P extends { t: number }>(points: readonly P[], from: number, to: number): readonly P[] {
  const asSamples = points as unknown as readonly Sample[];
  return points.slice(firstIndexAtOrAfter(asSamples, from), firstIndexAfter(asSamples, to));
}

type GaugeFunction = 'last' | 'mean' | 'min' | 'max';

function gaugeValue(samples: readonly Sample[], at: number, windowMs: number, fn: GaugeFunction): number | null {
  const inWindow = slice(samples, at - windowMs, at);
  if (inWindow.length === 0) return null;
  return evaluateAligned(inWindow, { from: at, to: at, stepMs: 1, windowMs, fn })[0]?.v ?? null;
}

function rateOver(samples: readonly Sample[], from: number, to: number): number | null {
  return counterRate(slice(samples, from, to), from, to);
}

function increaseOver(samples: readonly Sample[], from: number, to: number): number | null {
  return counterIncrease(slice(samples, from, to), from, to);
}

/** sum or mean of the values that exist; null when none does. */
function combine(values: Array<number | null>, op: AggregationOp): number | null {
  const present = values.filter((v): v is number => v !== null && Number.isFinite(v)).map((value) => ({ labels: {}, value }));
  if (present.length === 0) return null;
  return aggregateByLabels(present, [], op)[0]?.value ?? null;
}

const noData = (reason: NoDataReason = 'no_data'): Observation => ({ kind: 'no_data', reason });
const valueObs = (value: number | null, firing: boolean): Observation => ({ kind: 'value', value, firing });

/**
 * Evaluates `rule` at `at` (ms) over [at − window, at]. Every group that has a series appears in
 * the result, with a no-data observation when its window holds too little; groups come back sorted
 * by key.
 */
export function evaluateRule(rule: RuleDocument, data: RuleData, atMs: number): GroupEvaluation[] {
  const at = Math.round(atMs);
  const w = rule.window * 1000;
  let out: GroupEvaluation[];
  switch (rule.kind) {
    case 'threshold':
      out = evaluateThreshold(rule, data, at, w);
      break;
    case 'counter_rate':
      out = evaluateCounterRate(rule, data, at, w);
      break;
    case 'error_ratio':
      out = evaluateErrorRatio(rule, data, at, w);
      break;
    case 'latency_quantile':
    case 'latency_share':
      out = evaluateLatency(rule, data, at, w);
      break;
    case 'time_to_limit':
      out = evaluateTimeToLimit(rule, data, at, w);
      break;
    case 'outlier':
      out = evaluateOutlier(rule, data, at, w);
      break;
    case 'rate_of_change':
      out = evaluateRateOfChange(rule, data, at, w);
      break;
  }
  return out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
}

function evaluateThreshold(rule: RuleOf<'threshold'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  return [...groupSeries(data.series, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    const v = combine(g.members.map((s) => gaugeValue(s.samples, at, w, rule.aggregation)), rule.combine);
    return { key, labels: g.labels, observation: v === null ? noData() : valueObs(v, compare(v, rule.op, rule.threshold)), detail: { series: g.members.length } };
  });
}

function evaluateCounterRate(rule: RuleOf<'counter_rate'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  return [...groupSeries(data.series, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    const v = combine(g.members.map((s) => rateOver(s.samples, at - w, at)), 'sum');
    return { key, labels: g.labels, observation: v === null ? noData() : valueObs(v, compare(v, rule.op, rule.threshold)), detail: { series: g.members.length } };
  });
}

/**
 * Δerrors / Δrequests per group. No requests series with data: no data. Requests that did not
 * grow: no traffic (never 0 %). A group with no error series at all counts zero errors (error
 * counters often appear only at their first error); error series that exist but have no data in
 * the window give no data rather than a clean bill of health.
 */
function evaluateErrorRatio(rule: RuleOf<'error_ratio'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  type Tagged = SampleSeries & { role: 'errors' | 'requests' };
  const tagged: Tagged[] = [...data.series.map((s) => ({ ...s, role: 'errors' as const })), ...data.requests.map((s) => ({ ...s, role: 'requests' as const }))];
  return [...groupSeries(tagged, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    const errorSeries = g.members.filter((s) => s.role === 'errors');
    const requests = combine(g.members.filter((s) => s.role === 'requests').map((s) => increaseOver(s.samples, at - w, at)), 'sum');
    const errorIncreases = errorSeries.map((s) => increaseOver(s.samples, at - w, at));
    const errors = errorSeries.length === 0 ? 0 : combine(errorIncreases, 'sum');
    const detail = { errors, requests };
    if (requests === null || errors === null) return { key, labels: g.labels, observation: noData(), detail };
    const r = ratioOfIncreases(errors, requests);
    if (r.kind === 'no_traffic') return { key, labels: g.labels, observation: noData('no_traffic'), detail };
    return { key, labels: g.labels, observation: valueObs(r.value, compare(r.value, rule.op, rule.threshold)), detail };
  });
}

/** Bucket growth over the window summed per group (series with another bucket layout are left out). */
function evaluateLatency(rule: RuleOf<'latency_quantile'> | RuleOf<'latency_share'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  return [...groupSeries(data.histograms, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    let total: HistogramBuckets | null = null;
    let skipped = 0;
    for (const s of g.members) {
      const inc = histogramIncrease(slice(s.points, at - w, at), at - w, at);
      if (!inc) continue;
      if (!total) total = { bounds: inc.bounds, counts: [...inc.counts] };
      else if (!sameBounds(total.bounds, inc.bounds)) skipped++;
      else total = { bounds: total.bounds, counts: total.counts.map((c, i) => c + inc.counts[i]!) };
    }
    if (!total) return { key, labels: g.labels, observation: noData(), detail: { observations: null } };
    const observations = total.counts.reduce((a, b) => a + b, 0);
    const v = rule.kind === 'latency_quantile' ? histogramQuantile(rule.quantile, total) : shareAbove(rule.bound, total);
    const detail = { observations, skippedSeries: skipped };
    if (v === null) return { key, labels: g.labels, observation: noData(observations === 0 ? 'no_traffic' : 'no_data'), detail };
    return { key, labels: g.labels, observation: valueObs(v, compare(v, rule.op, rule.threshold)), detail };
  });
}

/**
 * Least-squares line per series over the window (x in seconds relative to `at`, so the intercept
 * is the fitted level now), combined per group (sum or mean of slopes and of levels, which is the
 * fit of the combined series when all share their sample times). The value is the seconds until
 * the line reaches the limit: 0 when the level is already past it, null when it never does.
 */
function evaluateTimeToLimit(rule: RuleOf<'time_to_limit'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  return [...groupSeries(data.series, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    const fits = g.members.map((s) => linearTrend(slice(s.samples, at - w, at).map((p) => ({ x: (p.t - at) / 1000, y: p.v }))));
    const slope = combine(fits.map((f) => f?.slope ?? null), rule.combine);
    const level = combine(fits.map((f) => f?.intercept ?? null), rule.combine);
    if (slope === null || level === null) return { key, labels: g.labels, observation: noData(), detail: { level: null, slope: null } };
    const reached = rule.direction === 'above' ? level >= rule.limit : level <= rule.limit;
    const seconds = reached ? 0 : timeToLimit({ slope, intercept: level }, rule.limit, 0);
    const firing = seconds !== null && seconds <= rule.horizon;
    return { key, labels: g.labels, observation: valueObs(seconds, firing), detail: { level, slope, timeToLimitSeconds: seconds } };
  });
}

/**
 * Each member's value (gauge: `aggregation` over the window; counter: its rate), summed over the
 * member's series, scored against the other members of its group by modified z-score. The alert
 * group is the group's labels plus the member label.
 */
function evaluateOutlier(rule: RuleOf<'outlier'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  const out: GroupEvaluation[] = [];
  for (const [, peers] of groupSeries(data.series, rule.groupBy)) {
    const perSeries = peers.members.map((s) => ({
      labels: s.labels,
      value: data.signalKind === 'counter' ? rateOver(s.samples, at - w, at) : gaugeValue(s.samples, at, w, rule.aggregation),
    }));
    const members = new Map<string, Labels>();
    for (const s of peers.members) {
      const labels = { ...peers.labels, [rule.memberLabel]: s.labels[rule.memberLabel] ?? '' };
      members.set(groupKey(labels), labels);
    }
    const withValues = aggregateByLabels(
      perSeries.filter((s): s is { labels: Labels; value: number } => s.value !== null),
      [...rule.groupBy, rule.memberLabel],
      'sum',
    );
    const values = new Map(withValues.map((m) => [groupKey(m.labels), m.value]));
    const keys = [...values.keys()];
    const scores = new Map(keys.length >= MIN_OUTLIER_PEERS ? modifiedZScores(keys.map((k) => values.get(k)!)).map((z, i) => [keys[i]!, z]) : []);
    for (const [key, labels] of members) {
      const value = values.get(key) ?? null;
      const score = scores.get(key);
      const detail = { memberValue: value, peers: keys.length };
      if (value === null) out.push({ key, labels, observation: noData(), detail });
      else if (score === undefined || !Number.isFinite(score)) out.push({ key, labels, observation: noData('too_few_peers'), detail });
      else {
        const firing = rule.direction === 'above' ? score > rule.threshold : rule.direction === 'below' ? score < -rule.threshold : Math.abs(score) > rule.threshold;
        out.push({ key, labels, observation: valueObs(score, firing), detail });
      }
    }
  }
  return out;
}

/** Rates over the two consecutive windows ending at at − window and at, and their difference per second. */
function evaluateRateOfChange(rule: RuleOf<'rate_of_change'>, data: RuleData, at: number, w: number): GroupEvaluation[] {
  return [...groupSeries(data.series, rule.groupBy)].map(([key, g]): GroupEvaluation => {
    const previousRate = combine(g.members.map((s) => rateOver(s.samples, at - 2 * w, at - w)), 'sum');
    const rate = combine(g.members.map((s) => rateOver(s.samples, at - w, at)), 'sum');
    const change = rateOfChange([
      { t: at - w, v: previousRate },
      { t: at, v: rate },
    ])[0];
    const detail = { previousRate, rate };
    if (!change) return { key, labels: g.labels, observation: noData(), detail };
    return { key, labels: g.labels, observation: valueObs(change.v, compare(change.v, rule.op, rule.threshold)), detail };
  });
}
