// Alert rules as structured documents (issue 5): one zod schema per rule kind, no query language.
// The server validates every draft with these and the client's editor uses the same schemas.
// Durations are stored in seconds; drafts may also write them as "90s", "5m", "1h".
import { z } from 'zod';
import { emailSchema } from '../schemas/auth';
import { labelsSchema, parseDurationMs, serviceNameSchema, signalNameSchema, type SignalKind } from '../schemas/signals';
import { MODIFIED_Z_THRESHOLD } from '../metrics/outliers';

export const RULE_KINDS = [
  'threshold',
  'counter_rate',
  'error_ratio',
  'latency_quantile',
  'latency_share',
  'time_to_limit',
  'outlier',
  'rate_of_change',
] as const;
export type RuleKind = (typeof RULE_KINDS)[number];

export const RULE_KIND_LABELS: Record<RuleKind, string> = {
  threshold: 'Threshold on a gauge',
  counter_rate: 'Counter rate',
  error_ratio: 'Error ratio',
  latency_quantile: 'Latency quantile',
  latency_share: 'Share of latency above a bound',
  time_to_limit: 'Time to limit',
  outlier: 'Outlier among peers',
  rate_of_change: 'Rate of change of a rate',
};

/** Which signal kinds each rule kind reads (its main signal; error_ratio's requests are counters too). */
export const RULE_SIGNAL_KINDS: Record<RuleKind, readonly SignalKind[]> = {
  threshold: ['gauge'],
  counter_rate: ['counter'],
  error_ratio: ['counter'],
  latency_quantile: ['histogram'],
  latency_share: ['histogram'],
  time_to_limit: ['gauge', 'counter'],
  outlier: ['gauge', 'counter'],
  rate_of_change: ['counter'],
};

export const SEVERITIES = ['page', 'ticket'] as const;
export type Severity = (typeof SEVERITIES)[number];

export const COMPARISONS = ['>', '>=', '<', '<='] as const;
export type Comparison = (typeof COMPARISONS)[number];

export function compare(value: number, op: Comparison, threshold: number): boolean {
  switch (op) {
    case '>':
      return value > threshold;
    case '>=':
      return value >= threshold;
    case '<':
      return value < threshold;
    case '<=':
      return value <= threshold;
  }
}

const DAY_SECONDS = 86_400;

/** Seconds as a number, or duration text ("90s", "5m", "1h", "2d") → whole seconds. */
function seconds(opts: { min: number; max: number; what: string }) {
  return z.union([z.number(), z.string()]).transform((v, ctx) => {
    let s: number | null;
    if (typeof v === 'number') s = Number.isFinite(v) ? v : null;
    else if (/^\s*0\s*[a-z]*\s*$/.test(v)) s = 0;
    else {
      const ms = parseDurationMs(v);
      s = ms === null ? null : ms / 1000;
    }
    if (s === null) {
      ctx.addIssue({ code: 'custom', message: `${opts.what}: seconds, or a duration such as 30s, 5m, 1h` });
      return z.NEVER;
    }
    if (s < opts.min || s > opts.max) {
      ctx.addIssue({ code: 'custom', message: `${opts.what} must be between ${opts.min} s and ${opts.max} s` });
      return z.NEVER;
    }
    return Math.round(s * 1000) / 1000;
  });
}

const finite = (what: string) => z.number({ message: `${what}: a number` }).refine(Number.isFinite, `${what}: a finite number`);
const labelName = z.string().trim().min(1, 'a label name').max(200);
const comparison = z.enum(COMPARISONS, { message: `op is one of ${COMPARISONS.join(' ')}` });
const share = (what: string) => finite(what).pipe(z.number().min(0, `${what} is a share between 0 and 1`).max(1, `${what} is a share between 0 and 1`));

export const httpUrlSchema = z
  .string()
  .trim()
  .max(2000)
  .refine((u) => {
    try {
      const p = new URL(u);
      return p.protocol === 'http:' || p.protocol === 'https:';
    } catch {
      return false;
    }
  }, 'a full http or https URL');
export const runbookUrlSchema = httpUrlSchema;

/** Fields every rule kind has. */
const common = {
  name: z.string().trim().min(1, 'Give the rule a name').max(200, 'at most 200 characters'),
  service: serviceNameSchema,
  signal: signalNameSchema,
  /** Exact-match label filters on the (main) signal's series. */
  filters: labelsSchema.default({}),
  /** One alert per distinct value of these labels; [] is one alert for the whole rule. */
  groupBy: z.array(labelName).max(16, 'at most 16 labels').default([]),
  /** Each evaluation looks back over this many seconds. */
  window: seconds({ min: 1, max: DAY_SECONDS, what: 'window' }),
  /** The condition must hold this long before pending becomes raised. */
  sustain: seconds({ min: 0, max: DAY_SECONDS, what: 'sustain' }).default(0),
  /** A raised alert clears only after the condition has been false this long (no flapping). */
  clear: seconds({ min: 0, max: DAY_SECONDS, what: 'clear' }).default(0),
  severity: z.enum(SEVERITIES, { message: 'severity is page or ticket' }),
  responderNote: z
    .string({ message: 'Write the responder note: what the person alerted should check or do first' })
    .trim()
    .min(1, 'Write the responder note: what the person alerted should check or do first')
    .max(4000, 'at most 4000 characters'),
  runbookUrl: runbookUrlSchema.nullable().default(null),
  recipients: z.array(emailSchema).max(50, 'at most 50 recipients').default([]),
  channelIds: z.array(z.number().int().positive('a channel id')).max(20, 'at most 20 channels').default([]),
  enabled: z.boolean().default(true),
};

const comparisonFields = { op: comparison, threshold: finite('threshold') };

export const thresholdRuleSchema = z.object({
  kind: z.literal('threshold'),
  ...common,
  /** How each series' samples in the window become one number. */
  aggregation: z.enum(['last', 'mean', 'min', 'max']).default('mean'),
  /** How the series of one group combine. */
  combine: z.enum(['sum', 'mean']).default('mean'),
  ...comparisonFields,
});

/** Per-second increase of a counter over the window, summed over the group's series. */
export const counterRateRuleSchema = z.object({ kind: z.literal('counter_rate'), ...common, ...comparisonFields });

/** Δerrors / Δrequests over the window per group; no requests is "no traffic", never 0. */
export const errorRatioRuleSchema = z.object({
  kind: z.literal('error_ratio'),
  ...common,
  /** The requests counter (may be the same signal as `signal` with other filters). */
  requestsSignal: signalNameSchema,
  requestsFilters: labelsSchema.default({}),
  op: comparison,
  threshold: share('threshold'),
});

export const latencyQuantileRuleSchema = z.object({
  kind: z.literal('latency_quantile'),
  ...common,
  quantile: finite('quantile').pipe(z.number().gt(0, 'quantile is above 0 and at most 1').max(1, 'quantile is above 0 and at most 1')),
  ...comparisonFields,
});

export const latencyShareRuleSchema = z.object({
  kind: z.literal('latency_share'),
  ...common,
  /** Observations above this bound count as slow (exact when it is one of the bucket bounds). */
  bound: finite('bound'),
  op: comparison,
  threshold: share('threshold'),
});

/** Least-squares trend over the window; raises when the trend reaches `limit` within `horizon`. */
export const timeToLimitRuleSchema = z.object({
  kind: z.literal('time_to_limit'),
  ...common,
  limit: finite('limit'),
  /** above: rising towards the limit (disk used); below: falling towards it (disk free). */
  direction: z.enum(['above', 'below']),
  horizon: seconds({ min: 1, max: 90 * DAY_SECONDS, what: 'horizon' }),
  combine: z.enum(['sum', 'mean']).default('sum'),
});

/**
 * A member (a value of `memberLabel`, e.g. instance) far from its peers (the other members of its
 * `groupBy` group) by modified z-score. Gauges use `aggregation` over the window, counters their rate.
 */
export const outlierRuleSchema = z.object({
  kind: z.literal('outlier'),
  ...common,
  memberLabel: labelName,
  aggregation: z.enum(['last', 'mean', 'min', 'max']).default('mean'),
  threshold: finite('threshold').pipe(z.number().gt(0, 'threshold is a positive modified z-score')).default(MODIFIED_Z_THRESHOLD),
  direction: z.enum(['both', 'above', 'below']).default('both'),
});

/**
 * Acceleration of a counter's rate: (rate over the last window − rate over the window before) /
 * window, in units per second². op '>' with a positive threshold catches a climb, '<' with a
 * negative one a fall.
 */
export const rateOfChangeRuleSchema = z.object({ kind: z.literal('rate_of_change'), ...common, ...comparisonFields });

const ruleUnion = z.discriminatedUnion(
  'kind',
  [
    thresholdRuleSchema,
    counterRateRuleSchema,
    errorRatioRuleSchema,
    latencyQuantileRuleSchema,
    latencyShareRuleSchema,
    timeToLimitRuleSchema,
    outlierRuleSchema,
    rateOfChangeRuleSchema,
  ],
  { message: `kind is one of: ${RULE_KINDS.join(', ')}` },
);

export const ruleDocumentSchema = ruleUnion.superRefine((r, ctx) => {
  if (r.kind === 'outlier' && r.groupBy.includes(r.memberLabel))
    ctx.addIssue({ code: 'custom', path: ['memberLabel'], message: 'the member label cannot also be a group-by label (members are compared within their group)' });
  if (new Set(r.groupBy).size !== r.groupBy.length) ctx.addIssue({ code: 'custom', path: ['groupBy'], message: 'a label is listed twice' });
  if (new Set(r.channelIds).size !== r.channelIds.length) ctx.addIssue({ code: 'custom', path: ['channelIds'], message: 'a channel is listed twice' });
});

/** A rule as stored and evaluated (durations in seconds, defaults filled in). */
export type RuleDocument = z.output<typeof ruleDocumentSchema>;
/** A rule as a client writes it (durations may be text, defaults may be left out). */
export type RuleDraft = z.input<typeof ruleDocumentSchema>;
export type RuleOf<K extends RuleKind> = Extract<RuleDocument, { kind: K }>;

/** The signals a rule reads, with the document field that names each (for 400s naming the field). */
export function ruleSignals(rule: RuleDocument): Array<{ field: 'signal' | 'requestsSignal'; name: string; filters: Record<string, string> }> {
  const main = { field: 'signal' as const, name: rule.signal, filters: rule.filters };
  return rule.kind === 'error_ratio' ? [main, { field: 'requestsSignal', name: rule.requestsSignal, filters: rule.requestsFilters }] : [main];
}

/** How far back one evaluation reads (rate of change compares two consecutive windows). */
export function lookbackMs(rule: RuleDocument): number {
  return rule.window * 1000 * (rule.kind === 'rate_of_change' ? 2 : 1);
}

/** Fields that only change how an alert is presented or delivered, not when it holds. */
export const PRESENTATION_FIELDS = ['name', 'severity', 'responderNote', 'runbookUrl', 'recipients', 'channelIds', 'enabled'] as const;

/** A short human description of the condition, for mail and lists. */
export function describeCondition(rule: RuleDocument): string {
  const w = formatSeconds(rule.window);
  switch (rule.kind) {
    case 'threshold':
      return `${rule.aggregation} of ${rule.signal} over ${w} (${rule.combine} per group) ${rule.op} ${rule.threshold}`;
    case 'counter_rate':
      return `rate of ${rule.signal} over ${w} ${rule.op} ${rule.threshold}/s`;
    case 'error_ratio':
      return `Δ${rule.signal} / Δ${rule.requestsSignal} over ${w} ${rule.op} ${rule.threshold}`;
    case 'latency_quantile':
      return `p${+(rule.quantile * 100).toFixed(3)} of ${rule.signal} over ${w} ${rule.op} ${rule.threshold}`;
    case 'latency_share':
      return `share of ${rule.signal} above ${rule.bound} over ${w} ${rule.op} ${rule.threshold}`;
    case 'time_to_limit':
      return `trend of ${rule.signal} over ${w} goes ${rule.direction} ${rule.limit} within ${formatSeconds(rule.horizon)}`;
    case 'outlier':
      return `${rule.memberLabel} far from its peers in ${rule.signal} over ${w} (|modified z| > ${rule.threshold}${rule.direction === 'both' ? '' : `, ${rule.direction}`})`;
    case 'rate_of_change':
      return `change of the rate of ${rule.signal} per second over ${w} ${rule.op} ${rule.threshold}/s²`;
  }
}

export function formatSeconds(s: number): string {
  if (s >= 86_400 && s % 86_400 === 0) return `${s / 86_400}d`;
  if (s >= 3600 && s % 3600 === 0) return `${s / 3600}h`;
  if (s >= 60 && s % 60 === 0) return `${s / 60}m`;
  return `${s}s`;
}
