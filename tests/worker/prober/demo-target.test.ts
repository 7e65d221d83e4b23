import { request } from 'undici';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { CATALOGUE, DEMO_ACCOUNT, type DemoTarget, startDemoTarget } from '../../../scripts/demo-target';
import { runJourney } from '../../../worker/prober/run-journey';
import { journey } from './local-servers';

let target: DemoTarget;
let nextRandom = 0.5;

beforeEach(async () => {
  nextRandom = 0.5;
  target = await startDemoTarget({ port: 0, random: () => nextRandom });
});

afterEach(async () => {
  await target.close();
});

async function call(method: string, path: string, body?: unknown, token?: string) {
  const res = await request(`${target.url}${path}`, {
    method: method as 'GET',
    headers: { ...(body !== undefined ? { 'content-type': 'application/json' } : {}), ...(token ? { authorization: `Bearer ${token}` } : {}) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const text = await res.body.text();
  let json: any = null;
  try {
    json = JSON.parse(text);
  } catch {
    // not JSON
  }
  return { status: res.statusCode, headers: res.headers, text, json };
}

async function signIn() {
  return (await call('POST', '/api/sign-in', { email: DEMO_ACCOUNT.email, password: DEMO_ACCOUNT.password })).json.token as string;
}

describe('demo target: endpoints', () => {
  it('serves the home page and a redirect to it', async () => {
    const home = await call('GET', '/');
    expect(home.status).toBe(200);
    expect(home.headers['content-type']).toMatch(/text\/html/);
    expect(home.text).toContain('Quillmoor Tea Company');
    const shop = await call('GET', '/shop');
    expect(shop.status).toBe(302);
    expect(shop.headers.location).toBe('/');
  });

  it('signs in the demo account and refuses wrong credentials', async () => {
    const ok = await call('POST', '/api/sign-in', { email: DEMO_ACCOUNT.email, password: DEMO_ACCOUNT.password });
    expect(ok.status).toBe(200);
    expect(ok.json).toMatchObject({ token: expect.any(String), customer: { name: DEMO_ACCOUNT.name } });
    expect((await call('POST', '/api/sign-in', { email: DEMO_ACCOUNT.email, password: 'nope' })).status).toBe(401);
    expect((await call('POST', '/api/sign-in', { email: DEMO_ACCOUNT.email })).status).toBe(400);
  });

  it('searches the catalogue by name or kind', async () => {
    const oolong = await call('GET', '/api/search?q=oolong');
    expect(oolong.status).toBe(200);
    expect(oolong.json.items.map((i: { id: string }) => i.id)).toEqual(['tea-101', 'tea-107']);
    expect((await call('GET', '/api/search?q=jasmine')).json.count).toBe(1);
    expect((await call('GET', '/api/search')).json.count).toBe(CATALOGUE.length);
  });

  it('fills a basket and checks out, for signed-in customers only', async () => {
    expect((await call('POST', '/api/basket', { itemId: 'tea-101' })).status).toBe(401);
    const token = await signIn();
    expect((await call('POST', '/api/checkout', undefined, token)).status).toBe(409);
    expect((await call('POST', '/api/basket', { itemId: 'tea-999' }, token)).status).toBe(404);
    expect((await call('POST', '/api/basket', { itemId: 'tea-101', quantity: 0 }, token)).status).toBe(400);
    const added = await call('POST', '/api/basket', { itemId: 'tea-101', quantity: 2 }, token);
    expect(added.status).toBe(201);
    expect(added.json.totalCents).toBe(2900);
    expect((await call('GET', '/api/basket', undefined, token)).json.items).toHaveLength(1);
    const order = await call('POST', '/api/checkout', undefined, token);
    expect(order.status).toBe(201);
    expect(order.json).toMatchObject({ orderId: expect.stringMatching(/^Q-\d+$/), status: 'confirmed', totalCents: 2900 });
    expect((await call('GET', '/api/basket', undefined, token)).json.items).toEqual([]);
  });

  it('counts requests, errors and latencies per route', async () => {
    await call('GET', '/api/search?q=tea');
    await call('GET', '/api/search?q=sencha');
    await call('POST', '/api/sign-in', { email: 'x', password: 'y' });
    await target.control({ errorRate: 1 });
    await call('GET', '/api/search?q=tea');
    const stats = target.stats();
    expect(stats.routes['GET /api/search']).toMatchObject({ requests: 3, errors: 1, byStatus: { 200: 2, 503: 1 } });
    expect(stats.routes['POST /api/sign-in']).toMatchObject({ requests: 1, errors: 0, byStatus: { 401: 1 } });
    const latency = stats.routes['GET /api/search'].latency;
    expect(latency.count).toBe(3);
    expect(latency.bucketCounts).toHaveLength(latency.boundsMs.length + 1);
    expect(latency.bucketCounts.reduce((a, b) => a + b, 0)).toBe(3);
    expect(stats.requests).toBeGreaterThanOrEqual(4);
    expect(stats.errors).toBe(1);
  });
});

describe('demo target: failure switches', () => {
  it('errorRate answers 503 for that share of requests', async () => {
    await target.control({ errorRate: 0.3 });
    nextRandom = 0.29;
    expect((await call('GET', '/api/search?q=tea')).status).toBe(503);
    nextRandom = 0.31;
    expect((await call('GET', '/api/search?q=tea')).status).toBe(200);
    // The health check does not see it: a failure only the outside can notice.
    nextRandom = 0;
    expect((await call('GET', '/healthz')).status).toBe(200);
    await target.control({ errorRate: 0 });
    nextRandom = 0;
    expect((await call('GET', '/api/search?q=tea')).status).toBe(200);
  });

  it('addedLatencyMs delays responses', async () => {
    await target.control({ addedLatencyMs: 150 });
    const started = performance.now();
    expect((await call('GET', '/api/search?q=tea')).status).toBe(200);
    expect(performance.now() - started).toBeGreaterThanOrEqual(140);
    await target.control({ addedLatencyMs: 0 });
  });

  it('wrongBody answers 200 with a broken body, and the shop counts it as a success', async () => {
    await target.control({ wrongBody: true });
    const broken = await call('GET', '/api/search?q=tea');
    expect(broken.status).toBe(200);
    expect(broken.json).toBeNull();
    expect(() => JSON.parse(broken.text)).toThrow();
    expect(target.stats().routes['GET /api/search'].errors).toBe(0);
    await target.control({ wrongBody: false });
    expect((await call('GET', '/api/search?q=oolong')).json.count).toBe(2);
  });

  it('refuseConnections stops listening until switched back, through the control port', async () => {
    const control = (body: object) =>
      request(target.controlUrl, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }).then(async (r) => ({
        status: r.statusCode,
        json: (await r.body.json()) as any,
      }));
    expect(await control({ refuseConnections: true })).toMatchObject({ status: 200, json: { refuseConnections: true } });
    await expect(call('GET', '/')).rejects.toMatchObject({ code: 'ECONNREFUSED' });
    expect((await control({ refuseConnections: false })).json.refuseConnections).toBe(false);
    expect((await call('GET', '/')).status).toBe(200);
  });

  it('accepts settings over POST /control on the shop port and rejects bad ones', async () => {
    const post = (body: unknown) => call('POST', '/control', body);
    expect((await post({ errorRate: 0.5, addedLatencyMs: 10 })).json).toEqual({ errorRate: 0.5, addedLatencyMs: 10, wrongBody: false, refuseConnections: false });
    expect((await call('GET', '/control')).json.errorRate).toBe(0.5);
    expect(await post({ errorRate: 2 })).toMatchObject({ status: 400, json: { error: 'errorRate must be a number from 0 to 1' } });
    expect(await post({ wrongBody: 'yes' })).toMatchObject({ status: 400, json: { error: 'wrongBody must be true or false' } });
    expect(await post({ addedLatencyMs: -1 })).toMatchObject({ status: 400 });
    expect(target.settings()).toEqual({ errorRate: 0.5, addedLatencyMs: 10, wrongBody: false, refuseConnections: false });
  });
});

describe('the prober against the demo target', () => {
  const shopping = () =>
    journey([
      {
        name: 'Sign in',
        method: 'POST',
        url: `${target.url}/api/sign-in`,
        headers: [{ name: 'content-type', value: 'application/json' }],
        body: `{"email":"${DEMO_ACCOUNT.email}","password":"{{secret.SHOP_PASSWORD}}"}`,
        assertions: [{ kind: 'status', in: [200] }],
        captures: [{ from: 'json', name: 'token', path: '$.token' }],
      },
      {
        name: 'Search',
        method: 'GET',
        url: `${target.url}/api/search?q=oolong`,
        assertions: [{ kind: 'json', path: '$.count', op: 'ge', value: 1 }],
        captures: [{ from: 'json', name: 'itemId', path: '$.items[0].id' }],
      },
      {
        name: 'Add to basket',
        method: 'POST',
        url: `${target.url}/api/basket`,
        headers: [{ name: 'content-type', value: 'application/json' }, { name: 'authorization', value: 'Bearer {{token}}' }],
        body: '{"itemId":"{{itemId}}","quantity":1}',
        assertions: [{ kind: 'status', in: [201] }],
      },
      {
        name: 'Check out',
        method: 'POST',
        url: `${target.url}/api/checkout`,
        headers: [{ name: 'authorization', value: 'Bearer {{token}}' }],
        assertions: [{ kind: 'status', in: [201] }, { kind: 'json', path: '$.status', op: 'eq', value: 'confirmed' }],
      },
    ]);
  const options = () => ({ secrets: { SHOP_PASSWORD: DEMO_ACCOUNT.password }, vantage: 'local', targetPolicy: { allowLoopback: true } });

  it('walks sign-in, search, basket and checkout', async () => {
    const result = await runJourney(shopping(), options());
    expect(result.verdict).toBe('pass');
    expect(result.steps.map((s) => s.httpStatus)).toEqual([200, 200, 201, 201]);
    expect(result.steps[1].captures).toEqual({ itemId: 'tea-101' });
  });

  it('sees each switched-on failure as the matching failure class', async () => {
    await target.control({ wrongBody: true });
    expect(await runJourney(shopping(), options())).toMatchObject({ verdict: 'fail', failureClass: 'capture', failedStep: 0 });
    await target.control({ wrongBody: false, errorRate: 1 });
    expect(await runJourney(shopping(), options())).toMatchObject({ verdict: 'fail', failureClass: 'status', failedStep: 0 });
    await target.control({ errorRate: 0, refuseConnections: true });
    expect(await runJourney(shopping(), options())).toMatchObject({ verdict: 'fail', failureClass: 'connect' });
    await target.control({ refuseConnections: false, addedLatencyMs: 400 });
    const slow = shopping();
    slow.steps[0] = { ...slow.steps[0], timeoutMs: 200 };
    expect(await runJourney(slow, options())).toMatchObject({ verdict: 'fail', failureClass: 'timeout' });
    await target.control({ addedLatencyMs: 0 });
    expect((await runJourney(shopping(), options())).verdict).toBe('pass');
  });
});
