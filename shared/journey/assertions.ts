import { evaluateJsonPath } from './json-path';
import { type ObservedResponse, headerValue, jsonBody } from './observed-response';
import type { AssertionOutcome } from './run-result';
import type { Assertion } from './step-schema';

/** Without a status assertion a step expects a success or redirect status (200–399). */
export const DEFAULT_STATUS_RANGE = { min: 200, max: 399 } as const;

const SHOW_CHARS = 200;

function show(value: unknown): string {
  const text = value === undefined ? '(absent)' : typeof value === 'string' ? JSON.stringify(value) : JSON.stringify(value) ?? String(value);
  return text.length > SHOW_CHARS ? `${text.slice(0, SHOW_CHARS)}…` : text;
}

function jsonEqual(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (typeof a !== 'object' || typeof b !== 'object' || a === null || b === null) return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((x, i) => jsonEqual(x, b[i]));
  const ka = Object.keys(a);
  const kb = Object.keys(b);
  return ka.length === kb.length && ka.every((k) => Object.prototype.hasOwnProperty.call(b, k) && jsonEqual((a as any)[k], (b as any)[k]));
}

const OP_WORDS = { eq: '=', ne: '≠', lt: '<', le: '≤', gt: '>', ge: '≥', exists: 'exists' } as const;

function checkOne(assertion: Assertion, response: ObservedResponse): AssertionOutcome {
  const outcome = (passed: boolean, expected: string, actual: string): AssertionOutcome => ({ kind: assertion.kind, passed, expected, actual });
  switch (assertion.kind) {
    case 'status':
      return outcome(assertion.in.includes(response.status), `status in ${assertion.in.join(', ')}`, String(response.status));
    case 'latency':
      return outcome(response.totalMs < assertion.underMs, `latency under ${assertion.underMs} ms`, `${Math.round(response.totalMs)} ms`);
    case 'header-equals': {
      const actual = headerValue(response, assertion.header);
      return outcome(actual === assertion.value, `header ${assertion.header} = ${show(assertion.value)}`, show(actual));
    }
    case 'header-matches': {
      const actual = headerValue(response, assertion.header);
      const passed = actual !== undefined && new RegExp(assertion.pattern, assertion.flags).test(actual);
      return outcome(passed, `header ${assertion.header} matches /${assertion.pattern}/${assertion.flags ?? ''}`, show(actual));
    }
    case 'body-contains': {
      const passed = response.bodyText.includes(assertion.text);
      return outcome(passed, `body contains ${show(assertion.text)}`, passed ? 'found' : `not found in ${response.bodyText.length} characters`);
    }
    case 'body-matches': {
      const match = new RegExp(assertion.pattern, assertion.flags).exec(response.bodyText);
      return outcome(match !== null, `body matches /${assertion.pattern}/${assertion.flags ?? ''}`, match ? `matched ${show(match[0])}` : 'no match');
    }
    case 'json': {
      const expected = assertion.op === 'exists' ? `${assertion.path} exists` : `${assertion.path} ${OP_WORDS[assertion.op]} ${show(assertion.value)}`;
      const body = jsonBody(response);
      if (!body.ok) return outcome(false, expected, body.reason);
      const found = evaluateJsonPath(body.value, assertion.path);
      if (!found.found) return outcome(false, expected, `${assertion.path} is absent`);
      const actual = found.value;
      const numeric = (test: (a: number, b: number) => boolean) =>
        typeof actual === 'number' && typeof assertion.value === 'number' && test(actual, assertion.value);
      const passed = {
        exists: () => true,
        eq: () => jsonEqual(actual, assertion.value),
        ne: () => !jsonEqual(actual, assertion.value),
        lt: () => numeric((a, b) => a < b),
        le: () => numeric((a, b) => a <= b),
        gt: () => numeric((a, b) => a > b),
        ge: () => numeric((a, b) => a >= b),
      }[assertion.op]();
      return outcome(passed, expected, show(actual));
    }
  }
}

/** Checks every assertion of a step (all of them, so a failing run shows the whole picture). */
export function evaluateAssertions(assertions: readonly Assertion[], response: ObservedResponse): AssertionOutcome[] {
  const outcomes = assertions.map((a) => checkOne(a, response));
  if (!assertions.some((a) => a.kind === 'status')) {
    const { min, max } = DEFAULT_STATUS_RANGE;
    outcomes.unshift({
      kind: 'status',
      passed: response.status >= min && response.status <= max,
      expected: `status ${min}–${max} (no status assertion given)`,
      actual: String(response.status),
    });
  }
  return outcomes;
}
