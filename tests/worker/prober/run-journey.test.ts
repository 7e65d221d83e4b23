import { Buffer } from 'node:buffer';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseTraceparent } from '../../../shared/journey/trace-context';
import type { StepTimings } from '../../../shared/journey/run-result';
import { type ProbeAgent, type Resolver, createProbeAgent } from '../../../worker/prober/probe-agent';
import { runJourney } from '../../../worker/prober/run-journey';
import { type LocalServer, closedPort, journey, json, startServer } from './local-servers';

// The demo and the tests probe loopback, which the target rules refuse unless they say so.
const LOOPBACK = { allowLoopback: true };
const SECRET_TOKEN = 'sk_live/7Hq+Zp 9Wm2';

let server: LocalServer;
let other: LocalServer;

beforeAll(async () => {
  other = await startServer((req, res) => json(res, 200, { headers: req.headers }));
  server = await startServer((req, res) => {
    const url = new URL(req.url!, 'http://x');
    const r = url.pathname;
    if (r === '/ok') return json(res, 200, { ok: true, items: [{ id: 'tea-101' }] }, { 'x-shop': 'quiet' });
    if (r === '/unavailable') return json(res, 503, { error: 'try later' });
    if (r === '/login') return json(res, 200, { token: `tok-${JSON.parse(req.body).user}` });
    if (r === '/me') {
      return req.headers.authorization === 'Bearer tok-wren' ? json(res, 200, { name: 'Wren' }) : json(res, 401, { error: 'who are you' });
    }
    if (r.startsWith('/r/')) {
      const n = Number(r.slice(3));
      res.writeHead(302, { location: n > 1 ? `/r/${n - 1}` : '/ok' });
      return res.end();
    }
    if (r === '/see-other') {
      res.writeHead(303, { location: '/ok' });
      return res.end();
    }
    if (r === '/elsewhere') {
      res.writeHead(307, { location: `${other.url}/landing` });
      return res.end();
    }
    if (r === '/slow') return void setTimeout(() => json(res, 200, { late: true }), 2000);
    if (r === '/stall-body') {
      res.writeHead(200, { 'content-type': 'text/plain' });
      res.write('first part…');
      return void setTimeout(() => res.end('rest'), 2000);
    }
    if (r === '/echo') {
      res.writeHead(500, { 'content-type': 'text/plain' });
      return res.end(`url=${req.url}\nauth=${req.headers.authorization}\nb64=${Buffer.from(SECRET_TOKEN).toString('base64')}\n`);
    }
    if (r === '/big') {
      res.writeHead(500, { 'content-type': 'text/plain' });
      return res.end('é'.repeat(10_000));
    }
    json(res, 404, { error: 'no such page' });
  });
});

afterAll(async () => {
  await server.close();
  await other.close();
});

function expectOrdered(t: StepTimings) {
  const marks = [t.redirectMs, t.dnsMs, t.connectMs, t.tlsMs, t.ttfbMs, t.totalMs].filter((m): m is number => m !== null);
  for (let i = 1; i < marks.length; i++) expect(marks[i]).toBeGreaterThanOrEqual(marks[i - 1]);
}

/** An agent factory that keeps the agents it made, to look at their connection logs. */
function recordingAgents(resolve?: Resolver) {
  const made: ProbeAgent[] = [];
  return {
    made,
    factory: (policy: Parameters<typeof createProbeAgent>[0]['policy']) => {
      const agent = createProbeAgent({ policy, ...(resolve ? { resolve } : {}) });
      made.push(agent);
      return agent;
    },
  };
}

describe('runJourney against a local HTTP server', () => {
  it('passes a healthy step, with ordered phase timings and the traceparent it sent', async () => {
    const result = await runJourney(journey([{ name: 'Home', method: 'GET', url: `${server.url}/ok`, assertions: [{ kind: 'status', in: [200] }] }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(result).toMatchObject({ verdict: 'pass', failureClass: null, failedStep: null, voidReason: null, vantage: 'test' });
    const [step] = result.steps;
    expect(step).toMatchObject({ passed: true, httpStatus: 200, redirects: [], error: null, responseExcerpt: null });
    // An IP literal has no DNS phase (null, not 0); plain HTTP has no TLS.
    expect(step.timings.dnsMs).toBeNull();
    expect(step.timings.tlsMs).toBeNull();
    expect(step.timings.connectMs).not.toBeNull();
    expect(step.timings.ttfbMs).not.toBeNull();
    expectOrdered(step.timings);
    const sent = server.seen.at(-1)!;
    const trace = parseTraceparent(String(sent.headers.traceparent));
    expect(trace.ok && trace.value.traceId).toBe(step.traceId);
    expect(trace.ok && trace.value.sampled).toBe(true);
    expect(sent.headers['user-agent']).toMatch(/vantage test/);
  });

  it('measures DNS for a name (an injected resolver stands in for a foreign host)', async () => {
    const resolve: Resolver = async (host) => {
      expect(host).toBe('teashop.example');
      return [{ address: '127.0.0.1', family: 4 }];
    };
    const result = await runJourney(journey([{ name: 'Home', method: 'GET', url: `http://teashop.example:${server.port}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, resolve }),
    });
    expect(result.verdict).toBe('pass');
    const t = result.steps[0].timings;
    expect(t.dnsMs).not.toBeNull();
    expect(t.connectMs).not.toBeNull();
    expectOrdered(t);
    expect(server.seen.at(-1)!.headers.host).toBe(`teashop.example:${server.port}`);
  });

  it('fails on a status assertion with expected and actual, and keeps an excerpt', async () => {
    const result = await runJourney(
      journey([{ name: 'Search', method: 'GET', url: `${server.url}/unavailable`, assertions: [{ kind: 'status', in: [200] }, { kind: 'latency', underMs: 5000 }] }]),
      { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'status', failedStep: 0 });
    expect(result.steps[0].assertions).toEqual([
      { kind: 'status', passed: false, expected: 'status in 200', actual: '503' },
      { kind: 'latency', passed: true, expected: 'latency under 5000 ms', actual: expect.stringMatching(/^\d+ ms$/) },
    ]);
    expect(result.steps[0].error).toBe('status in 200, got 503');
    expect(result.steps[0].responseExcerpt).toBe('{"error":"try later"}');
  });

  it('fails other assertions as class assertion', async () => {
    const result = await runJourney(
      journey([
        {
          name: 'Home',
          method: 'GET',
          url: `${server.url}/ok`,
          assertions: [
            { kind: 'header-equals', header: 'x-shop', value: 'busy' },
            { kind: 'json', path: '$.items[0].id', op: 'eq', value: 'tea-101' },
          ],
        },
      ]),
      { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'assertion' });
    expect(result.steps[0].assertions.map((a) => [a.expected, a.actual, a.passed])).toEqual([
      ['status 200–399 (no status assertion given)', '200', true],
      ['header x-shop = "busy"', '"quiet"', false],
      ['$.items[0].id = "tea-101"', '"tea-101"', true],
    ]);
  });

  it('feeds captures into later steps, each step on a connection of its own', async () => {
    const result = await runJourney(
      journey([
        {
          name: 'Sign in',
          method: 'POST',
          url: `${server.url}/login`,
          headers: [{ name: 'content-type', value: 'application/json' }],
          body: '{"user":"wren"}',
          captures: [{ from: 'json', name: 'token', path: '$.token' }],
        },
        { name: 'Me', method: 'GET', url: `${server.url}/me`, headers: [{ name: 'authorization', value: 'Bearer {{token}}' }], assertions: [{ kind: 'status', in: [200] }] },
      ]),
      { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result.verdict).toBe('pass');
    expect(result.steps[0].captures).toEqual({ token: 'tok-wren' });
    // Every step measures its own TCP connect, even on the same origin.
    for (const step of result.steps) expect(step.timings.connectMs).not.toBeNull();
    expect(result.steps[0].traceId).not.toBe(result.steps[1].traceId);
  });

  it('fails with class capture when a capture finds nothing, and stops there', async () => {
    const result = await runJourney(
      journey([
        { name: 'Home', method: 'GET', url: `${server.url}/ok`, captures: [{ from: 'json', name: 'orderId', path: '$.orderId' }] },
        { name: 'Order', method: 'GET', url: `${server.url}/orders/{{orderId}}` },
      ]),
      { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'capture', failedStep: 0 });
    expect(result.steps).toHaveLength(1);
    expect(result.steps[0].error).toBe('could not capture orderId: $.orderId is absent from the body');
    expect(result.steps[0].responseExcerpt).toContain('tea-101');
  });

  it('stops at the first failing step', async () => {
    const result = await runJourney(
      journey([
        { name: 'one', method: 'GET', url: `${server.url}/ok` },
        { name: 'two', method: 'GET', url: `${server.url}/missing` },
        { name: 'three', method: 'GET', url: `${server.url}/ok` },
      ]),
      { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'status', failedStep: 1 });
    expect(result.steps.map((s) => s.name)).toEqual(['one', 'two']);
  });
});

describe('redirects', () => {
  it('are followed only when the step says so', async () => {
    const follow = await runJourney(journey([{ name: 'r', method: 'GET', url: `${server.url}/r/3`, followRedirects: true, assertions: [{ kind: 'status', in: [200] }] }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(follow.verdict).toBe('pass');
    expect(follow.steps[0].redirects).toEqual([
      { status: 302, location: `${server.url}/r/2` },
      { status: 302, location: `${server.url}/r/1` },
      { status: 302, location: `${server.url}/ok` },
    ]);
    expect(follow.steps[0].httpStatus).toBe(200);
    expect(follow.steps[0].timings.redirectMs).toBeGreaterThan(0);
    expectOrdered(follow.steps[0].timings);

    const stay = await runJourney(journey([{ name: 'r', method: 'GET', url: `${server.url}/r/3`, assertions: [{ kind: 'status', in: [302] }] }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(stay.verdict).toBe('pass');
    expect(stay.steps[0]).toMatchObject({ httpStatus: 302, redirects: [] });
  });

  it('are bounded by maxRedirects', async () => {
    const result = await runJourney(journey([{ name: 'r', method: 'GET', url: `${server.url}/r/3`, followRedirects: true, maxRedirects: 2 }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'status' });
    expect(result.steps[0].redirects).toHaveLength(2);
    expect(result.steps[0].error).toBe('stopped at redirect 3: the step allows at most 2');
  });

  it('turn POST into GET after 303 and drop credentials on another origin', async () => {
    const before = server.seen.length;
    const seeOther = await runJourney(journey([{ name: 'p', method: 'POST', url: `${server.url}/see-other`, body: 'x=1', followRedirects: true }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(seeOther.verdict).toBe('pass');
    expect(server.seen.slice(before).map((s) => `${s.method} ${s.url} ${s.body}`)).toEqual(['POST /see-other x=1', 'GET /ok ']);

    const away = await runJourney(
      journey([{ name: 'a', method: 'GET', url: `${server.url}/elsewhere`, followRedirects: true, headers: [{ name: 'authorization', value: 'Bearer {{secret.T}}' }] }]),
      { secrets: { T: SECRET_TOKEN }, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(away.verdict).toBe('pass');
    expect(other.seen.at(-1)!.headers.authorization).toBeUndefined();
    expect(server.seen.at(-1)!.headers.authorization).toBe(`Bearer ${SECRET_TOKEN}`);
  });
});

describe('network failures', () => {
  it('times out a slow response (class timeout)', async () => {
    const started = Date.now();
    const result = await runJourney(journey([{ name: 'slow', method: 'GET', url: `${server.url}/slow`, timeoutMs: 200 }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(Date.now() - started).toBeLessThan(1500);
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'timeout' });
    expect(result.steps[0]).toMatchObject({ httpStatus: null, error: 'no complete response within 200 ms' });
    expect(result.steps[0].timings.ttfbMs).toBeNull();
    expect(result.steps[0].timings.totalMs).toBeGreaterThanOrEqual(190);
  });

  it('times out a body that stalls after the headers', async () => {
    const result = await runJourney(journey([{ name: 'stall', method: 'GET', url: `${server.url}/stall-body`, timeoutMs: 300 }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'timeout' });
  });

  it('times out a connection that never gets going (a lookup that hangs), and ends the run promptly', async () => {
    const started = Date.now();
    const result = await runJourney(journey([{ name: 'stuck', method: 'GET', url: 'http://stuck.example/', timeoutMs: 200 }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, resolve: () => new Promise(() => undefined) }),
    });
    expect(Date.now() - started).toBeLessThan(1500);
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'timeout' });
    expect(result.steps[0].timings.dnsMs).toBeNull();
  });

  it('reports a refused connection as class connect', async () => {
    const port = await closedPort();
    const result = await runJourney(journey([{ name: 'gone', method: 'GET', url: `http://127.0.0.1:${port}/` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'connect' });
    expect(result.steps[0].error).toMatch(/ECONNREFUSED/);
    expect(result.steps[0].timings.connectMs).toBeNull();
  });

  it('reports a name that does not resolve as class dns (.invalid never resolves, RFC 2606)', async () => {
    const result = await runJourney(journey([{ name: 'nowhere', method: 'GET', url: 'http://parallax-probe-test.invalid/' }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
    });
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'dns' });
    expect(result.steps[0].error).toMatch(/could not resolve parallax-probe-test\.invalid/);
  });
});

describe('target safety', () => {
  const run = (url: string, targetPolicy: object, resolve?: Resolver) => {
    const agents = recordingAgents(resolve);
    return runJourney(journey([{ name: 'x', method: 'GET', url, timeoutMs: 5000 }]), { secrets: {}, vantage: 'test', targetPolicy, agent: agents.factory }).then((result) => ({ result, agents }));
  };

  it('refuses the cloud metadata address without connecting', async () => {
    const started = Date.now();
    const { result, agents } = await run('http://169.254.169.254/latest/meta-data/', LOOPBACK);
    expect(Date.now() - started).toBeLessThan(1000);
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'blocked' });
    expect(result.steps[0].error).toBe(
      'refused to connect to 169.254.169.254: 169.254.169.254 is a cloud metadata address (refused unless the target rules allow link-local addresses)',
    );
    // No socket was opened: the connection never got an address to connect to.
    expect(agents.made[0].connections).toEqual([expect.objectContaining({ host: '169.254.169.254', address: null, connectDoneAt: null })]);
  });

  it('checks every address a name resolves to', async () => {
    const sneaky: Resolver = async () => [
      { address: '127.0.0.1', family: 4 },
      { address: '169.254.169.254', family: 4 },
    ];
    const { result } = await run(`http://metadata.example:${server.port}/ok`, LOOPBACK, sneaky);
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'blocked' });
    expect(result.steps[0].error).toMatch(/refused to connect to metadata\.example: 169\.254\.169\.254 is a cloud metadata address/);
    expect(result.steps[0].timings.dnsMs).not.toBeNull();
  });

  it('refuses loopback unless the policy allows it, and IPv4-mapped IPv6 spellings too', async () => {
    expect((await run(`${server.url}/ok`, {})).result).toMatchObject({ verdict: 'fail', failureClass: 'blocked' });
    const mapped = await run('http://[::ffff:169.254.169.254]/', LOOPBACK);
    expect(mapped.result.failureClass).toBe('blocked');
    expect(mapped.result.steps[0].error).toMatch(/cloud metadata/);
    expect((await run('http://[fe80::1]/', LOOPBACK)).result.steps[0].error).toMatch(/link-local/);
    expect((await run(`${server.url}/ok`, { ...LOOPBACK, deny: ['127.0.0.0/24'] })).result.steps[0].error).toMatch(/deny list/);
    expect((await run(`${server.url}/ok`, { ...LOOPBACK, allow: ['10.0.0.0/8'] })).result.steps[0].error).toMatch(/outside the target rules allow list/);
  });
});

describe('secrets and void runs', () => {
  it('redacts secrets from the excerpt, URL, assertions and error (plain, URL-encoded and base64)', async () => {
    const result = await runJourney(
      journey([
        {
          name: 'echo',
          method: 'GET',
          url: `${server.url}/echo?key={{secret.API_TOKEN}}`,
          headers: [{ name: 'authorization', value: 'Bearer {{secret.API_TOKEN}}' }],
          assertions: [{ kind: 'body-contains', text: 'welcome' }],
        },
      ]),
      { secrets: { API_TOKEN: SECRET_TOKEN }, vantage: 'test', targetPolicy: LOOPBACK },
    );
    expect(result.verdict).toBe('fail');
    const step = result.steps[0];
    // The server really received the secret ...
    expect(server.seen.at(-1)!.headers.authorization).toBe(`Bearer ${SECRET_TOKEN}`);
    // ... and the stored result shows only marks.
    expect(step.responseExcerpt).toContain('auth=Bearer [secret:API_TOKEN]');
    expect(step.responseExcerpt).toContain('b64=[secret:API_TOKEN]');
    expect(step.url).toBe(`${server.url}/echo?key=[secret:API_TOKEN]`);
    const stored = JSON.stringify(result);
    for (const form of [SECRET_TOKEN, encodeURIComponent(SECRET_TOKEN), Buffer.from(SECRET_TOKEN).toString('base64'), 'sk_live/7Hq']) {
      expect(stored).not.toContain(form);
    }
  });

  it('bounds the excerpt to 4 KiB', async () => {
    const result = await runJourney(journey([{ name: 'big', method: 'GET', url: `${server.url}/big` }]), { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK });
    const excerpt = result.steps[0].responseExcerpt!;
    expect(Buffer.byteLength(excerpt)).toBe(4096);
    expect(excerpt).toBe('é'.repeat(2048));
  });

  it('is void, not failed, when shut down mid-run', async () => {
    const controller = new AbortController();
    setTimeout(() => controller.abort(new Error('worker shutting down')), 100);
    const result = await runJourney(journey([{ name: 'slow', method: 'GET', url: `${server.url}/slow` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      signal: controller.signal,
    });
    expect(result).toMatchObject({ verdict: 'void', failureClass: null, failedStep: null, voidReason: 'run aborted during step 0: worker shutting down' });
    const already = await runJourney(journey([{ name: 'x', method: 'GET', url: `${server.url}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      signal: AbortSignal.abort(),
    });
    expect(already).toMatchObject({ verdict: 'void', voidReason: 'run aborted before it started' });
  });

  it('is void for a missing secret, an invalid document or an internal error', async () => {
    const missing = await runJourney(journey([{ name: 'x', method: 'GET', url: `${server.url}/ok?k={{secret.NOPE}}` }]), { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK });
    expect(missing).toMatchObject({ verdict: 'void', failureClass: null });
    expect(missing.voidReason).toMatch(/unknown secret "NOPE"/);

    const invalid = await runJourney({ name: 'x', steps: [] } as never, { secrets: {}, vantage: 'test', targetPolicy: LOOPBACK });
    expect(invalid.verdict).toBe('void');
    expect(invalid.voidReason).toMatch(/^invalid journey document: steps: a journey needs at least one step/);

    const broken = await runJourney(journey([{ name: 'x', method: 'GET', url: `${server.url}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: () => {
        throw new Error('agent exploded');
      },
    });
    expect(broken).toMatchObject({ verdict: 'void', voidReason: 'internal error: agent exploded' });
  });

  it('stamps the run with the injected clock', async () => {
    let t = Date.UTC(2024, 0, 1, 12, 0, 0);
    const result = await runJourney(journey([{ name: 'x', method: 'GET', url: `${server.url}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      clock: { now: () => (t += 1000) },
    });
    expect(result.startedAt).toBe('2024-01-01T12:00:01.000Z');
    expect(result.finishedAt).toBe('2024-01-01T12:00:02.000Z');
  });
});
