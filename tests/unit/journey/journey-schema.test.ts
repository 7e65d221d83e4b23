import { describe, expect, it } from 'vitest';
import { describeIssues, journeyDocumentSchema } from '../../../shared/journey/journey-schema';
import { stepSchema } from '../../../shared/journey/step-schema';

const valid = {
  name: 'Buy a tea',
  steps: [
    {
      name: 'Sign in',
      method: 'POST',
      url: 'https://shop.example/api/sign-in',
      headers: [{ name: 'content-type', value: 'application/json' }],
      body: '{"email":"demo@shop.example","password":"{{secret.SHOP_PASSWORD}}"}',
      assertions: [{ kind: 'status', in: [200] }, { kind: 'json', path: '$.token', op: 'exists' }],
      captures: [{ from: 'json', name: 'token', path: '$.token' }],
    },
    {
      name: 'Search',
      method: 'GET',
      url: 'https://shop.example/api/search?q=oolong',
      headers: [{ name: 'authorization', value: 'Bearer {{token}}' }],
      assertions: [
        { kind: 'latency', underMs: 800 },
        { kind: 'header-matches', header: 'content-type', pattern: 'json', flags: 'i' },
        { kind: 'json', path: '$.count', op: 'ge', value: 1 },
      ],
      captures: [{ from: 'regex', name: 'itemId', pattern: '"id":"(tea-\\d+)"' }],
    },
  ],
  schedule: { kind: 'interval', everySeconds: 60 },
  vantages: ['eu-west', 'us-east'],
  failureQuorum: 2,
};

function problems(input: unknown): string[] {
  const result = journeyDocumentSchema.safeParse(input);
  return result.success ? [] : describeIssues(result.error);
}

describe('journey document schema', () => {
  it('accepts a complete journey and fills the defaults', () => {
    const doc = journeyDocumentSchema.parse(valid);
    expect(doc.enabled).toBe(true);
    expect(doc.steps[0]).toMatchObject({ timeoutMs: 10_000, followRedirects: false, maxRedirects: 5 });
    expect(doc.steps[1].captures[0]).toMatchObject({ group: 1 });
    expect(journeyDocumentSchema.parse({ ...valid, schedule: { kind: 'cron', expression: '*/5 * * * *' } }).schedule.kind).toBe('cron');
  });

  it('names the field in each error', () => {
    const bad = structuredClone(valid) as any;
    bad.steps[0].timeoutMs = 50;
    bad.steps[0].maxRedirects = 99;
    bad.steps[1].method = 'FETCH';
    bad.schedule = { kind: 'interval', everySeconds: 5 };
    expect(problems(bad)).toEqual([
      'steps.0.timeoutMs: timeoutMs must be at least 100',
      'steps.0.maxRedirects: maxRedirects must be at most 10',
      'steps.1.method: method must be one of GET, HEAD, POST, PUT, PATCH, DELETE, OPTIONS',
      'schedule.everySeconds: schedule everySeconds must be at least 10',
    ]);
  });

  it('explains schedule, vantage and quorum mistakes', () => {
    expect(problems({ ...valid, schedule: { kind: 'cron', expression: '0 0 9 * * *' } })).toEqual([
      'schedule.expression: cron expression needs 5 fields (minute hour day-of-month month day-of-week), got 6',
    ]);
    expect(problems({ ...valid, schedule: { kind: 'weekly' } })).toEqual(['schedule.kind: schedule kind must be interval or cron']);
    expect(problems({ ...valid, vantages: [] })).toContain('vantages: choose at least one vantage');
    expect(problems({ ...valid, vantages: ['eu-west', 'eu-west'], failureQuorum: 1 })).toEqual(['vantages: each vantage once']);
    expect(problems({ ...valid, failureQuorum: 3 })).toEqual(['failureQuorum: failureQuorum (3) cannot exceed the number of vantages (2)']);
    expect(problems({ ...valid, vantages: ['EU West'] })[0]).toMatch(/^vantages.0: vantage name must be/);
  });

  it('requires every {{variable}} to be captured by an earlier step', () => {
    const bad = structuredClone(valid) as any;
    bad.steps[0].url = 'https://shop.example/{{itemId}}/sign-in';
    bad.steps[1].headers.push({ name: 'x-order', value: '{{orderId}}' });
    expect(problems(bad)).toEqual([
      'steps.0.url: {{itemId}} is not captured by an earlier step',
      'steps.1.headers.1.value: {{orderId}} is not captured by an earlier step',
    ]);
  });

  it('checks assertions and captures', () => {
    const step = (extra: object) => stepSchema.safeParse({ name: 's', method: 'GET', url: 'https://a.example/', ...extra });
    const messages = (extra: object) => {
      const r = step(extra);
      return r.success ? [] : describeIssues(r.error);
    };
    expect(messages({ assertions: [{ kind: 'status', in: [] }] })).toEqual(['assertions.0.in: status "in" needs at least one status code']);
    expect(messages({ assertions: [{ kind: 'status', in: [700] }] })).toEqual(['assertions.0.in.0: status codes are 100–599']);
    expect(messages({ assertions: [{ kind: 'body-matches', pattern: '([a-z' }] })).toEqual(['assertions.0.pattern: body pattern is not a valid regular expression']);
    expect(messages({ assertions: [{ kind: 'json', path: '$.a', op: 'lt', value: 'x' }] })).toEqual(['assertions.0.value: json op lt compares numbers: value must be a number']);
    expect(messages({ assertions: [{ kind: 'json', path: '$.a', op: 'eq' }] })).toEqual(['assertions.0.value: json op eq needs a value to compare with']);
    expect(messages({ assertions: [{ kind: 'json', path: '$..a', op: 'exists' }] })[0]).toMatch(/^assertions.0.path: JSON path "\$..a" is not valid/);
    expect(messages({ assertions: [{ kind: 'smell' }] })[0]).toMatch(/^assertions.0.kind: assertion kind must be/);
    expect(messages({ captures: [{ from: 'json', name: '1st', path: '$.a' }] })).toEqual([
      'captures.0.name: variable name must start with a letter or _ and use only letters, digits and _',
    ]);
    expect(messages({ url: 'ftp://a.example/' })).toEqual(['url: url must start with http:// or https:// (or with a {{placeholder}} that holds one)']);
    expect(messages({ url: 'https://a.example/{{ not valid }}' })[0]).toMatch(/^url: "\{\{ not valid \}\}" .* is not a valid placeholder/);
    expect(messages({ body: 'x' })).toEqual(['body: body is not allowed with GET']);
    expect(messages({ headers: [{ name: 'bad header', value: 'x' }] })[0]).toMatch(/^headers.0.name: header name must be a valid HTTP token/);
    expect(messages({ headers: [{ name: 'Content-Length', value: '3' }] })).toEqual(['headers.0.name: header Content-Length is set by the prober itself']);
  });
});
