// The editor's form state. Numbers are kept as the text people type (so "1 0" or "" can be shown
// and corrected); documentFromDraft turns it into a journey document for the shared schema.
// This module imports types only, so the outer screen can use it without loading the schemas.
import type { JourneyDocumentInput } from '../../../shared/journey/journey-schema';
import type { Assertion, Capture, StepInput } from '../../../shared/journey/step-schema';

export const METHODS = ['GET', 'HEAD', 'POST', 'PUT', 'PATCH', 'DELETE', 'OPTIONS'] as const;
export type Method = (typeof METHODS)[number];
export const ASSERTION_KINDS = ['status', 'latency', 'header-equals', 'header-matches', 'body-contains', 'body-matches', 'json'] as const;
export type AssertionKind = (typeof ASSERTION_KINDS)[number];
export const JSON_OPS = ['eq', 'ne', 'lt', 'le', 'gt', 'ge', 'exists'] as const;
export type JsonOp = (typeof JSON_OPS)[number];
export const CAPTURE_SOURCES = ['json', 'header', 'regex'] as const;
export type CaptureSource = (typeof CAPTURE_SOURCES)[number];

export interface HeaderDraft {
  key: string;
  name: string;
  value: string;
}

/** Every field any assertion kind uses; the kind decides which are sent. */
export interface AssertionDraft {
  key: string;
  kind: AssertionKind;
  statuses: string;
  underMs: string;
  header: string;
  value: string;
  pattern: string;
  flags: string;
  text: string;
  path: string;
  op: JsonOp;
}

export interface CaptureDraft {
  key: string;
  from: CaptureSource;
  name: string;
  path: string;
  header: string;
  pattern: string;
  flags: string;
  group: string;
}

export interface StepDraft {
  key: string;
  name: string;
  method: Method;
  url: string;
  headers: HeaderDraft[];
  body: string;
  timeoutMs: string;
  followRedirects: boolean;
  maxRedirects: string;
  assertions: AssertionDraft[];
  captures: CaptureDraft[];
}

export interface JourneyDraft {
  name: string;
  steps: StepDraft[];
  scheduleKind: 'interval' | 'cron';
  everySeconds: string;
  cronExpression: string;
  vantages: string[];
  failureQuorum: string;
  enabled: boolean;
  serviceIds: number[];
}

let counter = 0;
export const newKey = () => `k${++counter}`;

export function newAssertion(kind: AssertionKind = 'status'): AssertionDraft {
  return { key: newKey(), kind, statuses: '200', underMs: '2000', header: '', value: '', pattern: '', flags: '', text: '', path: '$.', op: 'eq' };
}

export function newCapture(from: CaptureSource = 'json'): CaptureDraft {
  return { key: newKey(), from, name: '', path: '$.', header: '', pattern: '', flags: '', group: '1' };
}

export function newHeader(): HeaderDraft {
  return { key: newKey(), name: '', value: '' };
}

export function newStep(number: number): StepDraft {
  return {
    key: newKey(),
    name: `Step ${number}`,
    method: 'GET',
    url: '',
    headers: [],
    body: '',
    timeoutMs: '10000',
    followRedirects: false,
    maxRedirects: '5',
    assertions: [],
    captures: [],
  };
}

export function emptyDraft(): JourneyDraft {
  return {
    name: '',
    steps: [newStep(1)],
    scheduleKind: 'interval',
    everySeconds: '300',
    cronExpression: '*/5 * * * *',
    vantages: [],
    failureQuorum: '1',
    enabled: true,
    serviceIds: [],
  };
}

function assertionDraft(a: Assertion): AssertionDraft {
  const d = newAssertion(a.kind);
  switch (a.kind) {
    case 'status':
      return { ...d, statuses: a.in.join(', ') };
    case 'latency':
      return { ...d, underMs: String(a.underMs) };
    case 'header-equals':
      return { ...d, header: a.header, value: a.value };
    case 'header-matches':
      return { ...d, header: a.header, pattern: a.pattern, flags: a.flags ?? '' };
    case 'body-contains':
      return { ...d, text: a.text };
    case 'body-matches':
      return { ...d, pattern: a.pattern, flags: a.flags ?? '' };
    case 'json':
      return { ...d, path: a.path, op: a.op, value: a.value === undefined ? '' : typeof a.value === 'string' ? a.value : JSON.stringify(a.value) };
  }
}

function captureDraft(c: Capture | (Omit<Extract<Capture, { from: 'regex' }>, 'group'> & { group?: number })): CaptureDraft {
  const d = { ...newCapture(c.from), name: c.name };
  if (c.from === 'json') return { ...d, path: c.path };
  if (c.from === 'header') return { ...d, header: c.header, pattern: c.pattern ?? '' };
  return { ...d, pattern: c.pattern, flags: c.flags ?? '', group: String(c.group ?? 1) };
}

/** A saved document (or a HAR import's draft, whose defaults are not filled in yet) as form state. */
export function draftFromDocument(doc: JourneyDocumentInput, serviceIds: number[] = []): JourneyDraft {
  const base = emptyDraft();
  return {
    name: doc.name ?? '',
    steps: (doc.steps ?? []).map((s: StepInput) => ({
      key: newKey(),
      name: s.name,
      method: (METHODS as readonly string[]).includes(s.method) ? (s.method as Method) : 'GET',
      url: s.url,
      headers: (s.headers ?? []).map((h) => ({ key: newKey(), name: h.name, value: h.value })),
      body: s.body ?? '',
      timeoutMs: String(s.timeoutMs ?? 10_000),
      followRedirects: s.followRedirects ?? false,
      maxRedirects: String(s.maxRedirects ?? 5),
      assertions: (s.assertions ?? []).map((a) => assertionDraft(a as Assertion)),
      captures: (s.captures ?? []).map((c) => captureDraft(c as Capture)),
    })),
    scheduleKind: doc.schedule?.kind ?? 'interval',
    everySeconds: doc.schedule?.kind === 'interval' ? String(doc.schedule.everySeconds) : base.everySeconds,
    cronExpression: doc.schedule?.kind === 'cron' ? doc.schedule.expression : base.cronExpression,
    vantages: [...(doc.vantages ?? [])],
    failureQuorum: String(doc.failureQuorum ?? 1),
    enabled: doc.enabled ?? true,
    serviceIds,
  };
}

/** Text as a number for the schema: empty stays empty (the schema's default or its message applies). */
function num(text: string): number | undefined {
  const t = text.trim();
  return t === '' ? undefined : Number(t);
}

/** A JSON value as typed: valid JSON (42, true, "x", [1]) as itself, anything else as plain text. */
function jsonValue(text: string): unknown {
  const t = text.trim();
  if (t === '') return undefined;
  try {
    return JSON.parse(t);
  } catch {
    return text;
  }
}

function assertionFromDraft(a: AssertionDraft): unknown {
  switch (a.kind) {
    case 'status':
      return { kind: 'status', in: a.statuses.split(/[\s,]+/).filter(Boolean).map(Number) };
    case 'latency':
      return { kind: 'latency', underMs: num(a.underMs) };
    case 'header-equals':
      return { kind: 'header-equals', header: a.header.trim(), value: a.value };
    case 'header-matches':
      return { kind: 'header-matches', header: a.header.trim(), pattern: a.pattern, ...(a.flags ? { flags: a.flags } : {}) };
    case 'body-contains':
      return { kind: 'body-contains', text: a.text };
    case 'body-matches':
      return { kind: 'body-matches', pattern: a.pattern, ...(a.flags ? { flags: a.flags } : {}) };
    case 'json':
      return { kind: 'json', path: a.path.trim(), op: a.op, ...(a.op === 'exists' ? {} : { value: jsonValue(a.value) }) };
  }
}

function captureFromDraft(c: CaptureDraft): unknown {
  const name = c.name.trim();
  if (c.from === 'json') return { from: 'json', name, path: c.path.trim() };
  if (c.from === 'header') return { from: 'header', name, header: c.header.trim(), ...(c.pattern ? { pattern: c.pattern } : {}) };
  return { from: 'regex', name, pattern: c.pattern, ...(c.flags ? { flags: c.flags } : {}), group: num(c.group) };
}

/** The document the form describes, not yet checked (the shared schema does that). */
export function documentFromDraft(d: JourneyDraft): Record<string, unknown> {
  return {
    name: d.name,
    steps: d.steps.map((s) => ({
      name: s.name,
      method: s.method,
      url: s.url.trim(),
      headers: s.headers.filter((h) => h.name.trim() !== '' || h.value !== '').map((h) => ({ name: h.name.trim(), value: h.value })),
      ...(s.body !== '' ? { body: s.body } : {}),
      timeoutMs: num(s.timeoutMs),
      followRedirects: s.followRedirects,
      maxRedirects: num(s.maxRedirects),
      assertions: s.assertions.map(assertionFromDraft),
      captures: s.captures.map(captureFromDraft),
    })),
    schedule: scheduleFromDraft(d),
    vantages: d.vantages,
    failureQuorum: num(d.failureQuorum),
    enabled: d.enabled,
  };
}

export function scheduleFromDraft(d: Pick<JourneyDraft, 'scheduleKind' | 'everySeconds' | 'cronExpression'>): Record<string, unknown> {
  return d.scheduleKind === 'interval' ? { kind: 'interval', everySeconds: num(d.everySeconds) } : { kind: 'cron', expression: d.cronExpression.trim() };
}
