// Small builders for rule tests: a valid draft of each kind and series made of plain arrays.
import type { HistogramPoint, Sample } from '../../../shared/metrics';
import type { HistogramSeries, RuleData, SampleSeries } from '../../../shared/rules/evaluate-rule';
import { ruleDocumentSchema, type RuleDocument, type RuleDraft } from '../../../shared/rules/rule-schema';

export const T0 = Date.UTC(2026, 9, 1, 12, 0, 0);

const base = {
  name: 'test rule',
  service: 'checkout',
  window: 300,
  severity: 'page',
  responderNote: 'Check the payment provider status page first.',
} as const;

export function rule(draft: Partial<RuleDraft> & { kind: RuleDocument['kind'] } & Record<string, unknown>): RuleDocument {
  return ruleDocumentSchema.parse({ signal: 'sig', ...base, ...draft });
}

export function series(id: number, labels: Record<string, string>, samples: Sample[]): SampleSeries {
  return { id, labels, samples: [...samples].sort((a, b) => a.t - b.t) };
}

export function histSeries(id: number, labels: Record<string, string>, points: HistogramPoint[]): HistogramSeries {
  return { id, labels, points: [...points].sort((a, b) => a.t - b.t) };
}

export function data(part: Partial<RuleData>): RuleData {
  return { signalKind: 'gauge', series: [], histograms: [], requests: [], ...part };
}

/** Samples every `stepMs` from `from` (inclusive) to `to` (inclusive) with values from `f`. */
export function every(stepMs: number, from: number, to: number, f: (t: number, i: number) => number): Sample[] {
  const out: Sample[] = [];
  for (let t = from, i = 0; t <= to; t += stepMs, i++) out.push({ t, v: f(t, i) });
  return out;
}
