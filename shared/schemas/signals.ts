// Inputs and views of internal signals: services, signals, series, samples, queries, CSV import and
// collection targets (DESIGN.md §3, issue 4). The server validates with these; the client's forms
// use the same schemas.
import { z } from 'zod';

export const SIGNAL_KINDS = ['counter', 'gauge', 'histogram'] as const;
export type SignalKind = (typeof SIGNAL_KINDS)[number];

const NAME_MAX = 255;
const LABEL_MAX = 64;

/** Service names come from OTLP `service.name`; anything printable up to 200 characters. */
export const serviceNameSchema = z.string().trim().min(1, 'Give the service a name').max(200, 'at most 200 characters');
export const signalNameSchema = z.string().trim().min(1, 'Give the signal a name').max(NAME_MAX, `at most ${NAME_MAX} characters`);
export const labelsSchema = z
  .record(z.string().min(1).max(200), z.string().max(1000))
  .refine((l) => Object.keys(l).length <= LABEL_MAX, `at most ${LABEL_MAX} labels`);

// ---------------------------------------------------------------------------------------------
// Time and durations
// ---------------------------------------------------------------------------------------------

const DURATION_UNITS: Record<string, number> = { ms: 1, s: 1000, m: 60_000, h: 3_600_000, d: 86_400_000 };

/** "90s", "5m", "1h", "2d", "250ms" or a bare number of seconds → milliseconds (null if not one). */
export function parseDurationMs(text: string): number | null {
  const m = /^\s*(\d+(?:\.\d+)?)\s*(ms|s|m|h|d)?\s*$/.exec(text);
  if (!m) return null;
  const ms = Number(m[1]) * DURATION_UNITS[m[2] ?? 's'];
  return Number.isFinite(ms) && ms > 0 ? Math.round(ms) : null;
}

export const durationSchema = z.string().transform((s, ctx) => {
  const ms = parseDurationMs(s);
  if (ms === null) {
    ctx.addIssue({ code: 'custom', message: 'a duration such as 30s, 5m, 1h or 2d' });
    return z.NEVER;
  }
  return ms;
});

/** An instant as ISO 8601 text or milliseconds since the epoch (number or digits) → ms. */
export function parseInstantMs(value: unknown): number | null {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (typeof value !== 'string' || value.trim() === '') return null;
  const s = value.trim();
  if (/^-?\d+(\.\d+)?$/.test(s)) return Number(s);
  // Date.parse accepts many loose forms; insist on something that starts like ISO 8601.
  if (!/^\d{4}-\d{2}-\d{2}([T ]\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})?)?$/.test(s)) return null;
  const ms = Date.parse(s.includes(' ') ? s.replace(' ', 'T') : s);
  return Number.isFinite(ms) ? ms : null;
}

/** Earliest and latest instants the intake stores: older is a unit mistake, later a clock one. */
export const EARLIEST_SAMPLE_MS = Date.UTC(2000, 0, 1);
export const FUTURE_SLACK_MS = 24 * 3_600_000;

export const instantSchema = z.union([z.number(), z.string()]).transform((v, ctx) => {
  const ms = parseInstantMs(v);
  if (ms === null) {
    ctx.addIssue({ code: 'custom', message: 'an ISO 8601 time or milliseconds since the epoch' });
    return z.NEVER;
  }
  return ms;
});

// ---------------------------------------------------------------------------------------------
// Plain JSON batch: POST /api/signals/samples
// ---------------------------------------------------------------------------------------------

// The API's JSON body limit (1 MB) holds about this many points; larger loads go through OTLP or CSV.
export const MAX_BATCH_POINTS = 5_000;

const finiteNumber = z.number({ message: 'a number' }).refine(Number.isFinite, 'a finite number');

export const batchPointSchema = z
  .object({
    service: serviceNameSchema,
    signal: signalNameSchema,
    kind: z.enum(SIGNAL_KINDS, { message: `kind is one of: ${SIGNAL_KINDS.join(', ')}` }),
    unit: z.string().max(64).optional(),
    labels: labelsSchema.default({}),
    t: instantSchema,
    value: finiteNumber.optional(),
    /** Histograms only: finite upper bounds, and one more count than bounds (the +Inf bucket). */
    bounds: z.array(finiteNumber).max(200).optional(),
    counts: z.array(z.number().int().min(0)).max(201).optional(),
    sum: finiteNumber.optional(),
  })
  .superRefine((p, ctx) => {
    if (p.kind === 'histogram') {
      if (!p.bounds) ctx.addIssue({ code: 'custom', path: ['bounds'], message: 'a histogram needs bounds' });
      if (!p.counts) ctx.addIssue({ code: 'custom', path: ['counts'], message: 'a histogram needs counts' });
      if (p.bounds && p.counts && p.counts.length !== p.bounds.length + 1)
        ctx.addIssue({ code: 'custom', path: ['counts'], message: 'counts must have one more entry than bounds (the last bucket is +Inf)' });
      if (p.bounds && p.bounds.some((b, i) => i > 0 && !(b > p.bounds![i - 1])))
        ctx.addIssue({ code: 'custom', path: ['bounds'], message: 'bounds must be strictly increasing' });
    } else if (p.value === undefined) {
      ctx.addIssue({ code: 'custom', path: ['value'], message: 'a number' });
    }
    if (p.t < EARLIEST_SAMPLE_MS || p.t > Date.now() + FUTURE_SLACK_MS)
      ctx.addIssue({ code: 'custom', path: ['t'], message: 'time must lie between 2000-01-01 and a day from now (milliseconds, not seconds?)' });
  });
export type BatchPoint = z.infer<typeof batchPointSchema>;

export const samplesBatchSchema = z.object({
  points: z.array(batchPointSchema).min(1, 'Send at least one point').max(MAX_BATCH_POINTS, `At most ${MAX_BATCH_POINTS} points per request`),
});
export type SamplesBatch = z.infer<typeof samplesBatchSchema>;

export interface IngestResult {
  /** Points stored now. */
  accepted: number;
  /** Points already stored before (a re-sent batch or re-uploaded file): nothing changed. */
  duplicates: number;
  rejected: number;
  errors: IngestRejection[];
}
export interface IngestRejection {
  /** Index of the point in the request (batch) or its row number (CSV). */
  index: number;
  field?: string;
  message: string;
}

// ---------------------------------------------------------------------------------------------
// Services and signals
// ---------------------------------------------------------------------------------------------

export const createServiceSchema = z.object({
  name: serviceNameSchema,
  description: z.string().trim().max(2000).default(''),
  owner: z.string().trim().max(200).default(''),
});
export type CreateServiceInput = z.infer<typeof createServiceSchema>;

export const updateServiceSchema = z
  .object({ description: z.string().trim().max(2000).optional(), owner: z.string().trim().max(200).optional() })
  .strict()
  .refine((v) => v.description !== undefined || v.owner !== undefined, { message: 'Nothing to change: give description or owner' });
export type UpdateServiceInput = z.infer<typeof updateServiceSchema>;

export interface ServiceView {
  id: number;
  name: string;
  description: string;
  owner: string;
  createdAt: string;
  signalCount: number;
  seriesCount: number;
  lastSampleAt: string | null;
}

export const signalsListQuerySchema = z.object({ service: serviceNameSchema });

export interface SignalView {
  id: number;
  service: string;
  name: string;
  kind: SignalKind;
  unit: string;
  description: string;
  labelKeys: string[];
  seriesCount: number;
  lastSampleAt: string | null;
}

// ---------------------------------------------------------------------------------------------
// Query API: GET /api/signals/query
// ---------------------------------------------------------------------------------------------

export const QUERY_FUNCTIONS = ['raw', 'last', 'mean', 'min', 'max', 'increase', 'rate', 'ratio', 'quantile', 'share_above', 'trend'] as const;
export type QueryFunction = (typeof QUERY_FUNCTIONS)[number];

/** Query-string keys `label.<name>` and `denominatorLabel.<name>` are exact-match label filters. */
export const LABEL_FILTER_PREFIX = 'label.';
export const DENOMINATOR_LABEL_FILTER_PREFIX = 'denominatorLabel.';

const labelNameList = z
  .string()
  .max(1000)
  .transform((s) => s.split(',').map((x) => x.trim()).filter(Boolean));

export const signalQuerySchema = z
  .object({
    service: serviceNameSchema,
    signal: signalNameSchema,
    fn: z.enum(QUERY_FUNCTIONS, { message: `fn is one of: ${QUERY_FUNCTIONS.join(', ')}` }).optional(),
    by: labelNameList.optional(),
    agg: z.enum(['sum', 'mean'], { message: 'agg is sum or mean' }).optional(),
    window: durationSchema.optional(),
    step: durationSchema.optional(),
    from: instantSchema.optional(),
    to: instantSchema.optional(),
    /** ratio: the denominator signal of the same service (default: the same signal). */
    denominator: signalNameSchema.optional(),
    /** quantile: 0–1. */
    q: z.coerce.number().min(0, 'q is between 0 and 1').max(1, 'q is between 0 and 1').optional(),
    /** share_above: a bucket bound (exact when it is one of the histogram's bounds). */
    bound: z.coerce.number().refine(Number.isFinite, 'a finite number').optional(),
    /** trend: the level whose crossing time is forecast. */
    limit: z.coerce.number().refine(Number.isFinite, 'a finite number').optional(),
  })
  .catchall(z.string().max(1000))
  .superRefine((q, ctx) => {
    if (q.fn === 'quantile' && q.q === undefined) ctx.addIssue({ code: 'custom', path: ['q'], message: 'quantile needs q between 0 and 1' });
    if (q.fn === 'share_above' && q.bound === undefined) ctx.addIssue({ code: 'custom', path: ['bound'], message: 'share_above needs a bound' });
    if (q.from !== undefined && q.to !== undefined && q.from > q.to) ctx.addIssue({ code: 'custom', path: ['from'], message: 'from must not be after to' });
    for (const key of Object.keys(q)) {
      const known = ['service', 'signal', 'fn', 'by', 'agg', 'window', 'step', 'from', 'to', 'denominator', 'q', 'bound', 'limit'];
      if (known.includes(key)) continue;
      const name = key.startsWith(LABEL_FILTER_PREFIX)
        ? key.slice(LABEL_FILTER_PREFIX.length)
        : key.startsWith(DENOMINATOR_LABEL_FILTER_PREFIX)
          ? key.slice(DENOMINATOR_LABEL_FILTER_PREFIX.length)
          : null;
      if (!name) ctx.addIssue({ code: 'custom', path: [key], message: `unknown parameter; label filters are written ${LABEL_FILTER_PREFIX}<name>=<value>` });
    }
  });
export type SignalQueryInput = z.infer<typeof signalQuerySchema>;

/** Picks `label.<name>` (or another prefix) filters out of a parsed query. */
export function labelFilters(query: Record<string, unknown>, prefix = LABEL_FILTER_PREFIX): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of Object.entries(query)) if (k.startsWith(prefix) && typeof v === 'string') out[k.slice(prefix.length)] = v;
  return out;
}

export interface QueryPoint {
  t: number;
  /** null: the window held too little data. */
  v: number | null;
  /** ratio only: the denominator did not grow in the window (no traffic), which is not 0 %. */
  noTraffic?: true;
  /** trend only: the fitted level at t, and seconds until it reaches `limit` (null: never). */
  level?: number | null;
  timeToLimitSeconds?: number | null;
}

export interface QuerySeriesRef {
  id: number;
  signal: string;
  labels: Record<string, string>;
}

export interface QueryGroup {
  labels: Record<string, string>;
  /** Ids of the series (in `series`) that fed this group. */
  seriesIds: number[];
  points: QueryPoint[];
}

export interface QueryResult {
  service: string;
  signal: string;
  kind: SignalKind;
  unit: string;
  fn: QueryFunction;
  from: number;
  to: number;
  stepMs: number | null;
  windowMs: number | null;
  /** Median gap between samples of the slowest series (null with too few samples to tell). */
  samplingIntervalMs: number | null;
  groups: QueryGroup[];
  series: QuerySeriesRef[];
  warnings: string[];
}

// ---------------------------------------------------------------------------------------------
// CSV upload: POST /api/signals/csv
// ---------------------------------------------------------------------------------------------

const fromColumnOrValue = z
  .object({ column: z.string().min(1).optional(), value: z.string().min(1).optional() })
  .refine((v) => (v.column === undefined) !== (v.value === undefined), 'give either a column or a fixed value');

export const csvMappingSchema = z.object({
  time: z.object({ column: z.string().min(1, 'choose the time column'), format: z.enum(['auto', 'iso', 'ms', 's']).default('auto') }),
  value: z.object({ column: z.string().min(1, 'choose the value column') }),
  service: fromColumnOrValue,
  signal: fromColumnOrValue,
  kind: z
    .object({ column: z.string().min(1).optional(), value: z.enum(['counter', 'gauge']).optional() })
    .refine((v) => (v.column === undefined) !== (v.value === undefined), 'give either a column or a fixed kind'),
  unit: z.object({ column: z.string().min(1).optional(), value: z.string().max(64).optional() }).optional(),
  /** Label name → column holding its value. */
  labels: z.record(z.string().min(1).max(200), z.string().min(1)).default({}),
});
export type CsvMapping = z.infer<typeof csvMappingSchema>;

export interface CsvPreview {
  columns: string[];
  rows: string[][];
  delimiter: string;
  /** Columns whose first values look like times / numbers, to pre-fill the mapping form. */
  guesses: { time?: string; value?: string };
}

export interface CsvRowError {
  /** Spreadsheet numbering: the header is row 1, the first data row is row 2. */
  row: number;
  field: string;
  message: string;
}

export interface CsvImportResult {
  rows: number;
  imported: number;
  duplicates: number;
  rejected: number;
  errors: CsvRowError[];
  /** More rows failed than are listed in errors. */
  errorsTruncated: boolean;
}

// ---------------------------------------------------------------------------------------------
// Collection targets (JSON endpoints)
// ---------------------------------------------------------------------------------------------

const collectionTargetFields = {
  name: z.string().trim().min(1, 'Give the target a name').max(120),
  service: serviceNameSchema,
  url: z
    .string()
    .trim()
    .url('a full http(s) URL')
    .refine((u) => /^https?:\/\//i.test(u), 'an http or https URL'),
  intervalSeconds: z.number().int().min(5, 'at least 5 seconds').max(86_400, 'at most a day'),
  /** Flattened keys (a.b.c) to store as counters; every other number is a gauge. `*` matches one key part. */
  counterKeys: z.array(z.string().min(1).max(500)).max(500),
  labels: labelsSchema,
  /** Put before every signal name (e.g. "app."). */
  prefix: z.string().max(100),
  enabled: z.boolean(),
};

export const collectionTargetSchema = z.object({
  ...collectionTargetFields,
  counterKeys: collectionTargetFields.counterKeys.default([]),
  labels: collectionTargetFields.labels.default({}),
  prefix: collectionTargetFields.prefix.default(''),
  enabled: collectionTargetFields.enabled.default(true),
});
export type CollectionTargetInput = z.infer<typeof collectionTargetSchema>;

// Written out without defaults: zod applies a field's default even inside .partial().
export const updateCollectionTargetSchema = z
  .object(collectionTargetFields)
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, { message: 'Nothing to change' });
export type UpdateCollectionTargetInput = z.infer<typeof updateCollectionTargetSchema>;

export interface CollectionTargetView {
  id: number;
  name: string;
  service: string;
  url: string;
  intervalSeconds: number;
  counterKeys: string[];
  labels: Record<string, string>;
  prefix: string;
  enabled: boolean;
  nextRunAt: string;
  lastRunAt: string | null;
  lastError: string | null;
  lastSampleCount: number | null;
  createdAt: string;
  updatedAt: string;
}
