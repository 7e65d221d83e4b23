// GET /api/signals/query as a use-case: resolve the signal, refuse what would be too big or too
// short a window (naming the limit), fetch, evaluate with shared/metrics.
import type { Knex } from 'knex';
import { checkWindow, estimateSamplingInterval, MAX_ALIGNED_POINTS, type Sample, type WindowFunction } from '../../shared/metrics';
import {
  DENOMINATOR_LABEL_FILTER_PREFIX,
  labelFilters,
  type QueryFunction,
  type QueryResult,
  type SignalKind,
  type SignalQueryInput,
} from '../../shared/schemas/signals';
import { NotFoundError, ValidationError } from '../errors';
import { evaluateHistogram, evaluateRatio, evaluateTrend, evaluateWindowFunction, groupsOf, type Frame, type GroupResult, type SeriesData } from './query-evaluate';
import { partitionsRepo } from './repositories/partitions-repo';
import { queryRepo, type MatchedSeries } from './repositories/query-repo';
import { servicesRepo } from './repositories/services-repo';
import { signalsRepo, type SignalRecord } from './repositories/signals-repo';

export const QUERY_LIMITS = {
  /** Series one query may read (per signal). */
  maxSeries: 2_000,
  /** Points one answer may hold (groups × steps). */
  maxPoints: 50_000,
  /** Aligned instants per group. */
  maxSteps: MAX_ALIGNED_POINTS,
  /** Stored samples a raw query may return. */
  maxRawSamples: 50_000,
};

const ALLOWED: Record<SignalKind, QueryFunction[]> = {
  counter: ['raw', 'increase', 'rate', 'ratio', 'last', 'mean', 'min', 'max', 'trend'],
  gauge: ['raw', 'last', 'mean', 'min', 'max', 'trend'],
  histogram: ['raw', 'quantile', 'share_above'],
};
const DEFAULT_FN: Record<SignalKind, QueryFunction> = { counter: 'rate', gauge: 'last', histogram: 'quantile' };

export function queryService(db: Knex, now: () => Date = () => new Date()) {
  async function resolve(serviceId: number, service: string, name: string, field: string): Promise<SignalRecord> {
    const s = await signalsRepo.byName(db, serviceId, name);
    if (!s) throw Object.assign(new NotFoundError(`Signal ${name} of ${service}`), { field });
    return s;
  }

  async function match(signal: SignalRecord, filters: Record<string, string>, field: string): Promise<MatchedSeries[]> {
    const found = await queryRepo.matchSeries(db, signal.id, filters, QUERY_LIMITS.maxSeries);
    if (found.length > QUERY_LIMITS.maxSeries)
      throw new ValidationError(`${signal.name} has more than ${QUERY_LIMITS.maxSeries} matching series (the limit per query); add label filters`, field);
    return found;
  }

  async function rawStart(): Promise<number> {
    const parts = await partitionsRepo.list(db, 'samples');
    return parts.length ? parts[0]!.dayMs : Number.MAX_SAFE_INTEGER;
  }

  return {
    async run(input: SignalQueryInput): Promise<QueryResult> {
      const to = input.to ?? now().getTime();
      const from = input.from ?? to - 3_600_000;
      const serviceId = await servicesRepo.idByName(db, input.service);
      if (serviceId === null) throw Object.assign(new NotFoundError(`Service ${input.service}`), { field: 'query.service' });
      const signal = await resolve(serviceId, input.service, input.signal, 'query.signal');
      const fn = input.fn ?? DEFAULT_FN[signal.kind];
      if (!ALLOWED[signal.kind].includes(fn))
        throw new ValidationError(`${fn} does not apply to ${signal.name}, a ${signal.kind}; use one of ${ALLOWED[signal.kind].join(', ')}`, 'query.fn');

      const windowMs = fn === 'raw' ? null : (input.window ?? 300_000);
      const span = to - from;
      const stepMs = fn === 'raw' ? null : (input.step ?? Math.max(1000, Math.ceil(span / 200 / 1000) * 1000));
      const steps = stepMs === null ? 0 : Math.floor(to / stepMs) - Math.ceil(from / stepMs) + 1;
      if (steps > QUERY_LIMITS.maxSteps)
        throw new ValidationError(`${steps} points per group exceed the limit of ${QUERY_LIMITS.maxSteps}; use a larger step or a shorter range`, 'query.step');

      const filters = labelFilters(input);
      const series = await match(signal, filters, 'query.signal');
      const warnings: string[] = [];
      const by = input.by ?? (fn === 'ratio' ? [] : null);
      const op = input.agg ?? 'sum';

      // Ratio: the denominator is another counter (or the same one with other label filters).
      let denominator: { signal: SignalRecord; series: MatchedSeries[] } | null = null;
      if (fn === 'ratio') {
        const d = input.denominator ? await resolve(serviceId, input.service, input.denominator, 'query.denominator') : signal;
        if (d.kind !== 'counter') throw new ValidationError(`ratio needs two counters; ${d.name} is a ${d.kind}`, 'query.denominator');
        denominator = { signal: d, series: await match(d, labelFilters(input, DENOMINATOR_LABEL_FILTER_PREFIX), 'query.denominator') };
      }

      const groupCount = fn === 'raw' ? series.length : groupsOf((denominator?.series ?? series).map((s) => ({ ...s, data: [] })), by).size;
      if (groupCount * steps > QUERY_LIMITS.maxPoints)
        throw new ValidationError(
          `${groupCount} groups × ${steps} points = ${groupCount * steps} points exceed the limit of ${QUERY_LIMITS.maxPoints}; use a larger step, fewer groups or a shorter range`,
          'query.step',
        );

      const fetchFrom = from - (windowMs ?? 0);
      const result: QueryResult = {
        service: input.service,
        signal: signal.name,
        kind: signal.kind,
        unit: signal.unit,
        fn,
        from,
        to,
        stepMs,
        windowMs,
        samplingIntervalMs: null,
        groups: [],
        series: [
          ...series.map((s) => ({ id: s.id, signal: signal.name, labels: s.labels })),
          ...(denominator?.series ?? []).filter((d) => !series.some((s) => s.id === d.id)).map((s) => ({ id: s.id, signal: denominator!.signal.name, labels: s.labels })),
        ],
        warnings,
      };

      if (signal.kind === 'histogram') {
        if (fn === 'raw') {
          await refuseLargeRaw(series, from, to, 'histogram_points');
          const data = await queryRepo.histograms(db, series.map((s) => s.id), from, to);
          result.groups = series.map((s) => ({ labels: s.labels, seriesIds: [s.id], points: (data.get(s.id) ?? []).map((p) => ({ t: p.t, v: p.counts.reduce((a, b) => a + b, 0) })) }));
          return result;
        }
        const data = await queryRepo.histograms(db, series.map((s) => s.id), fetchFrom, to);
        const withData = series.map((s) => ({ ...s, data: data.get(s.id) ?? [] }));
        result.samplingIntervalMs = refuseShortWindow(withData.map((s) => s.data.map((p) => ({ t: p.t, v: 0 }))), windowMs!);
        const frame: Frame = { from, to, stepMs: stepMs!, windowMs: windowMs! };
        const f = fn === 'quantile' ? { fn, q: input.q! } : { fn: 'share_above' as const, bound: input.bound! };
        result.groups = evaluateHistogram(withData, f, frame, by, warnings);
        return result;
      }

      const start = await rawStart();
      if (fn === 'raw') {
        await refuseLargeRaw(series, from, to, 'samples');
        const data = await queryRepo.samples(db, series.map((s) => s.id), from, to, start);
        result.groups = series.map((s) => ({ labels: s.labels, seriesIds: [s.id], points: (data.get(s.id) ?? []).map((p) => ({ t: p.t, v: p.v })) }));
        return result;
      }
      const load = async (list: MatchedSeries[]): Promise<SeriesData<Sample>[]> => {
        const data = await queryRepo.samples(db, list.map((s) => s.id), fetchFrom, to, start);
        return list.map((s) => ({ ...s, data: data.get(s.id) ?? [] }));
      };
      const frame: Frame = { from, to, stepMs: stepMs!, windowMs: windowMs! };
      const main = await load(series);
      let groups: GroupResult[];
      if (fn === 'ratio') {
        const den = denominator!.signal.id === signal.id && Object.keys(labelFilters(input, DENOMINATOR_LABEL_FILTER_PREFIX)).length === 0 ? main : await load(denominator!.series);
        result.samplingIntervalMs = refuseShortWindow([...main, ...den].map((s) => s.data), windowMs!);
        groups = evaluateRatio(main, den, frame, by ?? []);
      } else {
        result.samplingIntervalMs = refuseShortWindow(main.map((s) => s.data), windowMs!);
        groups =
          fn === 'trend'
            ? evaluateTrend(main, frame, { by, op }, input.limit)
            : evaluateWindowFunction(main, fn as WindowFunction, frame, { by, op });
      }
      result.groups = groups;
      return result;
    },
  };

  async function refuseLargeRaw(series: MatchedSeries[], from: number, to: number, table: 'samples' | 'histogram_points'): Promise<void> {
    const n = await queryRepo.countSamples(db, series.map((s) => s.id), from, to, table);
    if (n > QUERY_LIMITS.maxRawSamples)
      throw new ValidationError(`${n} samples exceed the limit of ${QUERY_LIMITS.maxRawSamples} for raw queries; shorten the range, filter labels or use a window function`, 'query.from');
  }
}

/**
 * The window must hold at least 2.5 sampling intervals (shared/metrics/window.ts). The slowest
 * series decides, since its windows are the ones that would come back empty. Returns the
 * interval it judged by.
 */
function refuseShortWindow(series: Sample[][], windowMs: number): number | null {
  let interval: number | null = null;
  for (const s of series) {
    const i = estimateSamplingInterval(s);
    if (i !== null && (interval === null || i > interval)) interval = i;
  }
  if (interval === null) return null;
  const check = checkWindow(windowMs, interval);
  if (!check.ok) throw new ValidationError(check.message, 'query.window');
  return interval;
}
