// The rule documents: each kind parses, defaults are filled in, and bad drafts name their field.
import { describe, expect, it } from 'vitest';
import { RULE_KINDS, ruleDocumentSchema, lookbackMs, describeCondition } from '../../../shared/rules/rule-schema';

const base = { name: 'r', service: 'checkout', signal: 's', window: '5m', severity: 'page', responderNote: 'Look at the queue depth first.' };

const DRAFTS = {
  threshold: { ...base, kind: 'threshold', op: '<', threshold: 10 },
  counter_rate: { ...base, kind: 'counter_rate', op: '>', threshold: 100 },
  error_ratio: { ...base, kind: 'error_ratio', requestsSignal: 'requests', op: '>', threshold: 0.05 },
  latency_quantile: { ...base, kind: 'latency_quantile', quantile: 0.99, op: '>', threshold: 0.5 },
  latency_share: { ...base, kind: 'latency_share', bound: 0.3, op: '>', threshold: 0.1 },
  time_to_limit: { ...base, kind: 'time_to_limit', limit: 0, direction: 'below', horizon: '4h' },
  outlier: { ...base, kind: 'outlier', memberLabel: 'instance' },
  rate_of_change: { ...base, kind: 'rate_of_change', op: '>', threshold: 0.5 },
} as const;

function fieldOf(draft: unknown): string | undefined {
  const r = ruleDocumentSchema.safeParse(draft);
  return r.success ? undefined : r.error.issues[0]?.path.join('.');
}

describe('rule documents', () => {
  it.each(RULE_KINDS)('parses a %s rule and fills in the defaults', (kind) => {
    const doc = ruleDocumentSchema.parse(DRAFTS[kind]);
    expect(doc).toMatchObject({ kind, window: 300, sustain: 0, clear: 0, filters: {}, groupBy: [], recipients: [], channelIds: [], runbookUrl: null, enabled: true });
    // A stored document parses to itself (durations are stored as seconds).
    expect(ruleDocumentSchema.parse(doc)).toEqual(doc);
    expect(describeCondition(doc).length).toBeGreaterThan(5);
  });

  it('takes durations as seconds or as text', () => {
    const doc = ruleDocumentSchema.parse({ ...DRAFTS.threshold, window: 90, sustain: '2m', clear: '1h' });
    expect([doc.window, doc.sustain, doc.clear]).toEqual([90, 120, 3600]);
    expect(lookbackMs(doc)).toBe(90_000);
    expect(lookbackMs(ruleDocumentSchema.parse({ ...DRAFTS.rate_of_change, window: 60 }))).toBe(120_000);
  });

  it('defaults the outlier threshold to 3.5 (Iglewicz & Hoaglin 1993, from memory)', () => {
    const doc = ruleDocumentSchema.parse(DRAFTS.outlier);
    expect(doc.kind === 'outlier' && doc.threshold).toBe(3.5);
  });

  it('refuses an empty or blank responder note', () => {
    expect(fieldOf({ ...DRAFTS.threshold, responderNote: '' })).toBe('responderNote');
    expect(fieldOf({ ...DRAFTS.threshold, responderNote: '   \n ' })).toBe('responderNote');
    const { responderNote: _n, ...without } = DRAFTS.threshold;
    expect(fieldOf(without)).toBe('responderNote');
  });

  it('names the failing field', () => {
    expect(fieldOf({ ...DRAFTS.threshold, window: 'soon' })).toBe('window');
    expect(fieldOf({ ...DRAFTS.threshold, window: 0 })).toBe('window');
    expect(fieldOf({ ...DRAFTS.threshold, severity: 'urgent' })).toBe('severity');
    expect(fieldOf({ ...DRAFTS.threshold, runbookUrl: 'javascript:alert(1)' })).toBe('runbookUrl');
    expect(fieldOf({ ...DRAFTS.threshold, runbookUrl: 'ftp://example.test/x' })).toBe('runbookUrl');
    expect(fieldOf({ ...DRAFTS.threshold, recipients: ['ops@example.test', 'not an address'] })).toBe('recipients.1');
    expect(fieldOf({ ...DRAFTS.threshold, kind: 'anomaly' })).toBe('kind');
    expect(fieldOf({ ...DRAFTS.error_ratio, threshold: 5 })).toBe('threshold');
    expect(fieldOf({ ...DRAFTS.latency_quantile, quantile: 0 })).toBe('quantile');
    expect(fieldOf({ ...DRAFTS.outlier, groupBy: ['instance'] })).toBe('memberLabel');
    expect(fieldOf({ ...DRAFTS.threshold, signal: '' })).toBe('signal');
  });

  it('accepts an http(s) runbook link', () => {
    expect(ruleDocumentSchema.parse({ ...DRAFTS.threshold, runbookUrl: 'https://wiki.example.test/runbooks/disk' }).runbookUrl).toBe('https://wiki.example.test/runbooks/disk');
  });
});
