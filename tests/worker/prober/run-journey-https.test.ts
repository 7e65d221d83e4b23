import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type Resolver, createProbeAgent } from '../../../worker/prober/probe-agent';
import { runJourney } from '../../../worker/prober/run-journey';
import { type LocalServer, journey, json, selfSignedCertificate, startServer } from './local-servers';

const LOOPBACK = { allowLoopback: true };
const toLoopback: Resolver = async () => [{ address: '127.0.0.1', family: 4 }];

let server: LocalServer;
let cert: { key: Buffer; cert: Buffer };

beforeAll(async () => {
  cert = selfSignedCertificate(['teashop.example']);
  server = await startServer((req, res) => json(res, 200, { path: req.url, sni: (req.socket as { servername?: string }).servername }), cert);
});

afterAll(async () => {
  await server.close();
});

describe('runJourney over HTTPS (self-signed certificate made in the test)', () => {
  it('measures DNS, TCP, TLS, first byte and total in order, with SNI for the name', async () => {
    const result = await runJourney(journey([{ name: 'Home', method: 'GET', url: `https://teashop.example:${server.port}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, resolve: toLoopback, tls: { ca: cert.cert } }),
    });
    expect(result.verdict).toBe('pass');
    const t = result.steps[0].timings;
    for (const mark of [t.dnsMs, t.connectMs, t.tlsMs, t.ttfbMs]) expect(mark).not.toBeNull();
    expect(t.dnsMs!).toBeLessThanOrEqual(t.connectMs!);
    expect(t.connectMs!).toBeLessThanOrEqual(t.tlsMs!);
    expect(t.tlsMs!).toBeLessThanOrEqual(t.ttfbMs!);
    expect(t.ttfbMs!).toBeLessThanOrEqual(t.totalMs);
    expect(t.tlsMs!).toBeGreaterThan(t.connectMs!); // a full handshake takes some time
    expect(server.seen.at(-1)!.headers.host).toBe(`teashop.example:${server.port}`);
  });

  it('measures TLS to an IP literal without a DNS phase', async () => {
    const result = await runJourney(journey([{ name: 'Home', method: 'GET', url: `${server.url}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, tls: { ca: cert.cert } }),
    });
    expect(result.verdict).toBe('pass');
    expect(result.steps[0].timings.dnsMs).toBeNull();
    expect(result.steps[0].timings.tlsMs).not.toBeNull();
  });

  it('fails with class tls on an untrusted certificate and on a name the certificate does not cover', async () => {
    const untrusted = await runJourney(journey([{ name: 'Home', method: 'GET', url: `https://teashop.example:${server.port}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, resolve: toLoopback }),
    });
    expect(untrusted).toMatchObject({ verdict: 'fail', failureClass: 'tls' });
    expect(untrusted.steps[0].error).toMatch(/self-signed certificate/);
    expect(untrusted.steps[0].timings.connectMs).not.toBeNull();
    expect(untrusted.steps[0].timings.tlsMs).toBeNull();

    const wrongName = await runJourney(journey([{ name: 'Home', method: 'GET', url: `https://other.example:${server.port}/ok` }]), {
      secrets: {},
      vantage: 'test',
      targetPolicy: LOOPBACK,
      agent: (policy) => createProbeAgent({ policy, resolve: toLoopback, tls: { ca: cert.cert } }),
    });
    expect(wrongName).toMatchObject({ verdict: 'fail', failureClass: 'tls' });
    expect(wrongName.steps[0].error).toMatch(/other\.example/);
  });
});
