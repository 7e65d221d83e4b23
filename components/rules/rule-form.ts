// The editor's values (text as typed) ↔ a rule document. Validation is the shared schema's; this
// only turns text into the document's types.
import { formatSeconds, RULE_KINDS, type RuleDocument, type RuleDraft, type RuleKind } from '../../shared/rules/rule-schema';

export interface RuleForm {
  kind: RuleKind;
  name: string;
  service: string;
  signal: string;
  /** "route=/pay, status=500" */
  filters: string;
  /** "zone, instance" */
  groupBy: string;
  window: string;
  sustain: string;
  clear: string;
  severity: 'page' | 'ticket';
  responderNote: string;
  runbookUrl: string;
  /** "a@x.org, b@x.org" */
  recipients: string;
  enabled: boolean;
  op: '>' | '>=' | '<' | '<=';
  threshold: string;
  aggregation: 'last' | 'mean' | 'min' | 'max';
  combine: 'sum' | 'mean';
  requestsSignal: string;
  requestsFilters: string;
  quantile: string;
  bound: string;
  limit: string;
  limitDirection: 'above' | 'below';
  horizon: string;
  memberLabel: string;
  outlierDirection: 'both' | 'above' | 'below';
}

export const EMPTY_RULE_FORM: RuleForm = {
  kind: 'threshold',
  name: '',
  service: '',
  signal: '',
  filters: '',
  groupBy: '',
  window: '5m',
  sustain: '2m',
  clear: '5m',
  severity: 'page',
  responderNote: '',
  runbookUrl: '',
  recipients: '',
  enabled: true,
  op: '>',
  threshold: '',
  aggregation: 'mean',
  combine: 'mean',
  requestsSignal: '',
  requestsFilters: '',
  quantile: '0.99',
  bound: '',
  limit: '',
  limitDirection: 'above',
  horizon: '4h',
  memberLabel: 'instance',
  outlierDirection: 'both',
};

export function isRuleKind(v: string): v is RuleKind {
  return (RULE_KINDS as readonly string[]).includes(v);
}

function list(text: string): string[] {
  return text
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s.length > 0);
}

function labels(text: string): Record<string, string> {
  const out: Record<string, string> = {};
  for (const part of list(text)) {
    const at = part.indexOf('=');
    if (at > 0) out[part.slice(0, at).trim()] = part.slice(at + 1).trim();
    else out[part] = '';
  }
  return out;
}

function labelsText(l: Record<string, string>): string {
  return Object.entries(l)
    .map(([k, v]) => `${k}=${v}`)
    .join(', ');
}

/** Empty text is left out so the schema says what is missing; other text must be a number. */
function num(text: string): number | undefined {
  const t = text.trim();
  if (t === '') return undefined;
  return Number(t);
}

export function toDraft(f: RuleForm): RuleDraft {
  const common = {
    name: f.name,
    service: f.service,
    signal: f.signal,
    filters: labels(f.filters),
    groupBy: list(f.groupBy),
    window: f.window.trim(),
    sustain: f.sustain.trim() || 0,
    clear: f.clear.trim() || 0,
    severity: f.severity,
    responderNote: f.responderNote,
    runbookUrl: f.runbookUrl.trim() === '' ? null : f.runbookUrl.trim(),
    recipients: list(f.recipients),
    enabled: f.enabled,
  };
  const cmp = { op: f.op, threshold: num(f.threshold) as number };
  switch (f.kind) {
    case 'threshold':
      return { kind: 'threshold', ...common, ...cmp, aggregation: f.aggregation, combine: f.combine };
    case 'counter_rate':
      return { kind: 'counter_rate', ...common, ...cmp };
    case 'error_ratio':
      return { kind: 'error_ratio', ...common, ...cmp, requestsSignal: f.requestsSignal, requestsFilters: labels(f.requestsFilters) };
    case 'latency_quantile':
      return { kind: 'latency_quantile', ...common, ...cmp, quantile: num(f.quantile) as number };
    case 'latency_share':
      return { kind: 'latency_share', ...common, ...cmp, bound: num(f.bound) as number };
    case 'time_to_limit':
      return { kind: 'time_to_limit', ...common, limit: num(f.limit) as number, direction: f.limitDirection, horizon: f.horizon.trim(), combine: f.combine };
    case 'outlier':
      return {
        kind: 'outlier',
        ...common,
        memberLabel: f.memberLabel,
        aggregation: f.aggregation,
        threshold: num(f.threshold) ?? undefined,
        direction: f.outlierDirection,
      };
    case 'rate_of_change':
      return { kind: 'rate_of_change', ...common, ...cmp };
  }
}

export function fromDocument(d: RuleDocument): RuleForm {
  const f: RuleForm = {
    ...EMPTY_RULE_FORM,
    kind: d.kind,
    name: d.name,
    service: d.service,
    signal: d.signal,
    filters: labelsText(d.filters),
    groupBy: d.groupBy.join(', '),
    window: formatSeconds(d.window),
    sustain: formatSeconds(d.sustain),
    clear: formatSeconds(d.clear),
    severity: d.severity,
    responderNote: d.responderNote,
    runbookUrl: d.runbookUrl ?? '',
    recipients: d.recipients.join(', '),
    enabled: d.enabled,
  };
  if ('op' in d) f.op = d.op;
  if ('threshold' in d) f.threshold = String(d.threshold);
  if ('aggregation' in d) f.aggregation = d.aggregation;
  if ('combine' in d) f.combine = d.combine;
  if (d.kind === 'error_ratio') {
    f.requestsSignal = d.requestsSignal;
    f.requestsFilters = labelsText(d.requestsFilters);
  }
  if (d.kind === 'latency_quantile') f.quantile = String(d.quantile);
  if (d.kind === 'latency_share') f.bound = String(d.bound);
  if (d.kind === 'time_to_limit') {
    f.limit = String(d.limit);
    f.limitDirection = d.direction;
    f.horizon = formatSeconds(d.horizon);
  }
  if (d.kind === 'outlier') {
    f.memberLabel = d.memberLabel;
    f.outlierDirection = d.direction;
  }
  return f;
}

/** The form field a schema path or server `field` points at ("rule.window" → "window"). */
export function formField(path: string): keyof RuleForm | 'form' {
  const first = path.replace(/^rule\./, '').split('.')[0] ?? '';
  if (first === 'direction') return 'limitDirection';
  if (first === 'requestsFilters' || first === 'filters' || first in EMPTY_RULE_FORM) return first as keyof RuleForm;
  return 'form';
}
