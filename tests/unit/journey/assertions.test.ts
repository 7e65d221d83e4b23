import { describe, expect, it } from 'vitest';
import { evaluateAssertions } from '../../../shared/journey/assertions';
import { extractCaptures } from '../../../shared/journey/captures';
import type { ObservedResponse } from '../../../shared/journey/observed-response';
import { assertionSchema, captureSchema } from '../../../shared/journey/step-schema';

const response: ObservedResponse = {
  status: 201,
  headers: { 'content-type': 'application/json; charset=utf-8', 'set-cookie': ['theme=dark; Path=/', 'sid=abc123; HttpOnly'], 'x-request-id': 'r-77' },
  bodyText: JSON.stringify({ orderId: 'Q-1001', totalCents: 2900, items: [{ id: 'tea-101', qty: 2 }], status: 'confirmed', note: null }),
  totalMs: 240.4,
};

const check = (raw: object) => evaluateAssertions([assertionSchema.parse(raw)], response);

describe('assertions', () => {
  it('report expected and actual for each kind', () => {
    expect(check({ kind: 'status', in: [200, 201] })).toEqual([{ kind: 'status', passed: true, expected: 'status in 200, 201', actual: '201' }]);
    expect(check({ kind: 'status', in: [200] })[0]).toMatchObject({ passed: false, actual: '201' });
    expect(check({ kind: 'latency', underMs: 200 })).toEqual([
      { kind: 'status', passed: true, expected: 'status 200–399 (no status assertion given)', actual: '201' },
      { kind: 'latency', passed: false, expected: 'latency under 200 ms', actual: '240 ms' },
    ]);
    expect(check({ kind: 'header-equals', header: 'X-Request-Id', value: 'r-77' })[1].passed).toBe(true);
    expect(check({ kind: 'header-equals', header: 'x-missing', value: 'a' })[1]).toMatchObject({ passed: false, actual: '(absent)' });
    expect(check({ kind: 'header-matches', header: 'content-type', pattern: '^APPLICATION/JSON', flags: 'i' })[1].passed).toBe(true);
    expect(check({ kind: 'body-contains', text: '"confirmed"' })[1].passed).toBe(true);
    expect(check({ kind: 'body-contains', text: 'refunded' })[1]).toMatchObject({ passed: false, actual: expect.stringMatching(/not found/) });
    expect(check({ kind: 'body-matches', pattern: 'Q-\\d+' })[1]).toMatchObject({ passed: true, actual: 'matched "Q-1001"' });
  });

  it('compare JSON values at a path', () => {
    const json = (op: string, path: string, value?: unknown) => check({ kind: 'json', path, op, value })[1];
    expect(json('eq', '$.orderId', 'Q-1001')).toMatchObject({ passed: true, expected: '$.orderId = "Q-1001"', actual: '"Q-1001"' });
    expect(json('eq', '$.items[0]', { id: 'tea-101', qty: 2 }).passed).toBe(true);
    expect(json('eq', '$.items[0]', { id: 'tea-101' }).passed).toBe(false);
    expect(json('ne', '$.status', 'cancelled').passed).toBe(true);
    expect(json('lt', '$.totalCents', 3000).passed).toBe(true);
    expect(json('le', '$.totalCents', 2900).passed).toBe(true);
    expect(json('gt', '$.totalCents', 2900).passed).toBe(false);
    expect(json('ge', 'items.0.qty', 2).passed).toBe(true);
    expect(json('gt', '$.orderId', 1)).toMatchObject({ passed: false, actual: '"Q-1001"' });
    expect(json('exists', '$.note')).toMatchObject({ passed: true, actual: 'null' });
    expect(json('exists', '$.refund')).toMatchObject({ passed: false, actual: '$.refund is absent' });
    expect(json('eq', '$.a', 1)).toMatchObject({ passed: false });
  });

  it('fail JSON assertions on a body that is not JSON, saying so', () => {
    const broken = { ...response, bodyText: '{"items": [' };
    const [, outcome] = evaluateAssertions([assertionSchema.parse({ kind: 'json', path: '$.items', op: 'exists' })], broken);
    expect(outcome).toMatchObject({ passed: false, actual: expect.stringMatching(/^body is not JSON/) });
  });

  it('default to 200–399 when no status assertion is given', () => {
    expect(evaluateAssertions([], { ...response, status: 302 })[0].passed).toBe(true);
    expect(evaluateAssertions([], { ...response, status: 503 })[0]).toMatchObject({ passed: false, actual: '503' });
  });
});

describe('captures', () => {
  const capture = (...raws: object[]) => extractCaptures(raws.map((r) => captureSchema.parse(r)), response);

  it('take values from a JSON path, a header and a regex group', () => {
    expect(
      capture(
        { from: 'json', name: 'orderId', path: '$.orderId' },
        { from: 'json', name: 'total', path: '$.totalCents' },
        { from: 'json', name: 'first', path: '$.items[0]' },
        { from: 'header', name: 'requestId', header: 'X-Request-Id' },
        { from: 'header', name: 'sid', header: 'set-cookie', pattern: '^sid=([^;]+)' },
        { from: 'regex', name: 'tea', pattern: '"id":"(tea-\\d+)"' },
        { from: 'regex', name: 'whole', pattern: 'Q-\\d+', group: 0 },
      ),
    ).toEqual({
      ok: true,
      values: { orderId: 'Q-1001', total: '2900', first: '{"id":"tea-101","qty":2}', requestId: 'r-77', sid: 'abc123', tea: 'tea-101', whole: 'Q-1001' },
    });
  });

  it('stop at the first capture that finds nothing, naming it', () => {
    expect(capture({ from: 'json', name: 'orderId', path: '$.orderId' }, { from: 'json', name: 'refund', path: '$.refund.id' }, { from: 'header', name: 'x', header: 'x-request-id' })).toEqual({
      ok: false,
      values: { orderId: 'Q-1001' },
      name: 'refund',
      reason: '$.refund.id is absent from the body',
    });
    expect(capture({ from: 'header', name: 'etag', header: 'etag' })).toMatchObject({ ok: false, reason: 'header etag is absent' });
    expect(capture({ from: 'regex', name: 'r', pattern: 'refund-(\\d+)' })).toMatchObject({ ok: false, reason: 'body does not match /refund-(\\d+)/' });
  });
});
