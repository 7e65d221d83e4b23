// nock 15 swaps undici's global dispatcher. The prober's own agent bypasses it by design, so here a
// ProbeAgent is built around the global dispatcher: this checks the run logic (assertions,
// captures, traceparent, failure classes) against a foreign host without any network.
import nock from 'nock';
import { getGlobalDispatcher } from 'undici';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { parseTraceparent } from '../../../shared/journey/trace-context';
import type { ProbeAgent } from '../../../worker/prober/probe-agent';
import { runJourney } from '../../../worker/prober/run-journey';
import { journey } from './local-servers';

const throughNock = (): ProbeAgent => ({ dispatcher: getGlobalDispatcher(), connections: [], close: async () => undefined });

beforeAll(() => {
  nock.disableNetConnect();
});

afterEach(() => {
  nock.cleanAll();
});

describe('runJourney against a foreign host (nock)', () => {
  it('runs a two-step journey and sends a traceparent on each step', async () => {
    const traceparents: string[] = [];
    const noteTraceparent = (value: string) => {
      traceparents.push(value);
      return true;
    };
    nock('https://api.teashop.example')
      .post('/v1/sign-in', { user: 'wren' })
      .matchHeader('traceparent', noteTraceparent)
      .reply(200, { token: 'tok-1' })
      .get('/v1/orders')
      .matchHeader('authorization', 'Bearer tok-1')
      .matchHeader('traceparent', noteTraceparent)
      .reply(200, { orders: [{ id: 'Q-1001' }] });
    const result = await runJourney(
      journey([
        { name: 'Sign in', method: 'POST', url: 'https://api.teashop.example/v1/sign-in', headers: [{ name: 'content-type', value: 'application/json' }], body: '{"user":"wren"}', captures: [{ from: 'json', name: 'token', path: '$.token' }] },
        { name: 'Orders', method: 'GET', url: 'https://api.teashop.example/v1/orders', headers: [{ name: 'authorization', value: 'Bearer {{token}}' }], assertions: [{ kind: 'json', path: '$.orders[0].id', op: 'eq', value: 'Q-1001' }] },
      ]),
      { secrets: {}, vantage: 'test', targetPolicy: {}, agent: throughNock },
    );
    expect(result.voidReason).toBeNull();
    expect(result.verdict).toBe('pass');
    expect(traceparents.map((t) => parseTraceparent(t).ok)).toEqual([true, true]);
    expect(traceparents.map((t) => t.split('-')[1])).toEqual(result.steps.map((s) => s.traceId));
    // No connector ran, so no connection phases were measured.
    expect(result.steps[0].timings).toMatchObject({ dnsMs: null, connectMs: null, tlsMs: null });
  });

  it('classifies a DNS failure from the dispatcher as class dns', async () => {
    nock('https://gone.teashop.example').get('/').replyWithError(Object.assign(new Error('getaddrinfo ENOTFOUND gone.teashop.example'), { code: 'ENOTFOUND' }));
    const result = await runJourney(journey([{ name: 'Home', method: 'GET', url: 'https://gone.teashop.example/' }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: {},
      agent: throughNock,
    });
    expect(result).toMatchObject({ verdict: 'fail', failureClass: 'dns' });
    expect(result.steps[0].error).toMatch(/ENOTFOUND/);
  });
});
