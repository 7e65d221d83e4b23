// The explorer's choices live in the address (shareable, and Back works): reading them, writing
// them, and turning them into a query the API accepts.
import type { Href } from 'expo-router';
import type { SignalQueryParams } from '../../../hooks/queries/signals';
import { parseDurationMs, type QueryFunction, type SignalKind, type SignalView } from '../../../shared/schemas/signals';

export const RANGES = [
  { key: '1h', label: '1 h', ms: 3_600_000 },
  { key: '6h', label: '6 h', ms: 6 * 3_600_000 },
  { key: '24h', label: '24 h', ms: 24 * 3_600_000 },
  { key: '7d', label: '7 d', ms: 7 * 24 * 3_600_000 },
] as const;
export type RangeKey = (typeof RANGES)[number]['key'];

/** The functions offered per kind, the kind's usual one first (the API allows a few more). */
export const FUNCTIONS_BY_KIND: Record<SignalKind, readonly QueryFunction[]> = {
  counter: ['rate', 'increase', 'ratio', 'raw'],
  gauge: ['last', 'mean', 'min', 'max', 'trend', 'raw'],
  histogram: ['quantile', 'share_above'],
};

export const FUNCTION_LABELS: Record<QueryFunction, string> = {
  rate: 'Rate /s',
  increase: 'Increase',
  ratio: 'Ratio',
  raw: 'Raw samples',
  last: 'Value',
  mean: 'Mean',
  min: 'Min',
  max: 'Max',
  trend: 'Trend',
  quantile: 'Quantile',
  share_above: 'Share above',
};

export const FUNCTION_HINTS: Record<QueryFunction, string> = {
  rate: 'Growth per second over each window; a drop is a counter reset and counts from zero.',
  increase: 'How much the counter grew over each window, resets handled.',
  ratio: 'Growth of this counter divided by the growth of another (or of this one with other filters). No requests is "no traffic", never 0 %.',
  raw: 'The stored samples as they arrived, one line per series.',
  last: 'The newest sample in each window.',
  mean: 'The mean of the samples in each window.',
  min: 'The smallest sample in each window.',
  max: 'The largest sample in each window.',
  trend: 'Least-squares slope per second over each window; with a limit, when it would be reached.',
  quantile: 'From the histogram buckets that grew in each window, interpolated inside the bucket.',
  share_above: 'The share of observations in each window above a bucket bound.',
};

export const QUANTILES = [0.5, 0.9, 0.95, 0.99] as const;

export interface ExplorerState {
  service: string | null;
  signal: string | null;
  /** null: the kind's usual function. */
  fn: QueryFunction | null;
  /** null: every series its own line; []: one line in total; else these labels. */
  by: string[] | null;
  agg: 'sum' | 'mean';
  window: string;
  step: string | null;
  range: RangeKey;
  q: number;
  bound: string;
  limit: string;
  denominator: string | null;
  filters: Record<string, string>;
  denominatorFilters: Record<string, string>;
}

export type SearchParams = Record<string, string | string[] | undefined>;

const FILTER = 'label.';
const DEN_FILTER = 'den.';
export const DEFAULT_WINDOW = '5m';

function one(v: string | string[] | undefined): string | undefined {
  return Array.isArray(v) ? v[0] : v;
}

export function readExplorerParams(params: SearchParams): ExplorerState {
  const filters: Record<string, string> = {};
  const denominatorFilters: Record<string, string> = {};
  for (const [k, raw] of Object.entries(params)) {
    const v = one(raw);
    if (v === undefined || v === '') continue;
    if (k.startsWith(FILTER)) filters[k.slice(FILTER.length)] = v;
    else if (k.startsWith(DEN_FILTER)) denominatorFilters[k.slice(DEN_FILTER.length)] = v;
  }
  const by = one(params.by);
  const range = one(params.range);
  const q = Number(one(params.q));
  return {
    service: one(params.service) || null,
    signal: one(params.signal) || null,
    fn: (one(params.fn) as QueryFunction | undefined) || null,
    by: by === undefined || by === '' ? null : by === '-' ? [] : by.split(',').filter(Boolean),
    agg: one(params.agg) === 'mean' ? 'mean' : 'sum',
    window: one(params.window) || DEFAULT_WINDOW,
    step: one(params.step) || null,
    range: RANGES.some((r) => r.key === range) ? (range as RangeKey) : '1h',
    q: Number.isFinite(q) && q > 0 && q < 1 ? q : 0.95,
    bound: one(params.bound) ?? '',
    limit: one(params.limit) ?? '',
    denominator: one(params.den) || null,
    filters,
    denominatorFilters,
  };
}

/** The address parameters for a state; keys the previous address had and this one lacks are cleared. */
export function explorerParamsPatch(previous: SearchParams, s: ExplorerState): Record<string, string | undefined> {
  const next: Record<string, string | undefined> = {
    service: s.service ?? undefined,
    signal: s.signal ?? undefined,
    fn: s.fn ?? undefined,
    by: s.by === null ? undefined : s.by.length === 0 ? '-' : s.by.join(','),
    agg: s.agg === 'mean' ? 'mean' : undefined,
    window: s.window === DEFAULT_WINDOW ? undefined : s.window,
    step: s.step ?? undefined,
    range: s.range === '1h' ? undefined : s.range,
    // Kept whatever the function: a histogram's quantile is its default function, chosen or not.
    q: s.q !== 0.95 ? String(s.q) : undefined,
    bound: s.bound || undefined,
    limit: s.limit || undefined,
    den: s.denominator ?? undefined,
  };
  for (const [k, v] of Object.entries(s.filters)) next[`${FILTER}${k}`] = v;
  for (const [k, v] of Object.entries(s.denominatorFilters)) next[`${DEN_FILTER}${k}`] = v;
  for (const k of Object.keys(previous)) if (!(k in next)) next[k] = undefined;
  return next;
}

export function explorerHref(service: string, signal?: string): Href {
  return { pathname: '/signals/explore', params: signal ? { service, signal } : { service } };
}

/** The function actually used: the chosen one when it fits the signal's kind, else the kind's usual one. */
export function effectiveFunction(state: ExplorerState, kind: SignalKind): QueryFunction {
  const offered = FUNCTIONS_BY_KIND[kind];
  return state.fn && offered.includes(state.fn) ? state.fn : offered[0]!;
}

export type QueryFieldErrors = Partial<Record<'window' | 'step' | 'bound' | 'limit', string>>;

/** The API query for the chosen signal, or the fields to fix first (checked here, before sending). */
export function toQueryParams(state: ExplorerState, signal: SignalView): { params: SignalQueryParams | null; errors: QueryFieldErrors } {
  const fn = effectiveFunction(state, signal.kind);
  const errors: QueryFieldErrors = {};
  if (fn !== 'raw') {
    if (parseDurationMs(state.window) === null) errors.window = 'A duration such as 30s, 5m or 1h';
    if (state.step !== null && parseDurationMs(state.step) === null) errors.step = 'A duration such as 15s or 1m, or empty for automatic';
  }
  const bound = state.bound.trim() === '' ? undefined : Number(state.bound);
  if (fn === 'share_above' && (bound === undefined || !Number.isFinite(bound))) errors.bound = 'A number: the bucket bound, in the signal’s unit';
  const limit = state.limit.trim() === '' ? undefined : Number(state.limit);
  if (fn === 'trend' && limit !== undefined && !Number.isFinite(limit)) errors.limit = 'A number, or empty';
  if (Object.keys(errors).length) return { params: null, errors };
  const rangeMs = RANGES.find((r) => r.key === state.range)!.ms;
  const keepLabels = (f: Record<string, string>) => Object.fromEntries(Object.entries(f).filter(([k]) => signal.labelKeys.includes(k)));
  return {
    errors,
    params: {
      service: signal.service,
      signal: signal.name,
      fn,
      // Raw samples are always one line per series; a ratio is never split per series.
      by: fn === 'raw' ? null : fn === 'ratio' && state.by === null ? [] : state.by,
      agg: state.agg,
      window: state.window,
      step: state.step,
      rangeMs,
      q: fn === 'quantile' ? state.q : undefined,
      bound: fn === 'share_above' ? bound : undefined,
      limit: fn === 'trend' ? limit : undefined,
      denominator: fn === 'ratio' ? (state.denominator ?? undefined) : undefined,
      filters: keepLabels(state.filters),
      denominatorFilters: fn === 'ratio' ? state.denominatorFilters : {},
    },
  };
}
