// The OpenTelemetry JS SDK as a real client (DESIGN.md §6, metrics intake): a MeterProvider with
// the OTLP/HTTP JSON exporter and the OTLP/HTTP protobuf exporter, each with cumulative and with
// delta temporality, exports to the real app listening on 127.0.0.1. The query API must then
// give back the increases, rates, ratios, last values and quantiles this test works out on its
// own from what it recorded.
import http from 'node:http';
import { ValueType } from '@opentelemetry/api';
import { CompressionAlgorithm } from '@opentelemetry/otlp-exporter-base';
import { AggregationTemporalityPreference, OTLPMetricExporter as JsonExporter } from '@opentelemetry/exporter-metrics-otlp-http';
import { OTLPMetricExporter as ProtoExporter } from '@opentelemetry/exporter-metrics-otlp-proto';
import { resourceFromAttributes } from '@opentelemetry/resources';
import { MeterProvider, PeriodicExportingMetricReader, type PushMetricExporter, type ResourceMetrics } from '@opentelemetry/sdk-metrics';
import * as ss from 'simple-statistics';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildTestApp, type TestApp } from '../../helpers/app';
import { makeToken } from '../../api/signals/otlp-fixtures';

let t: TestApp;
let server: http.Server;
let endpoint: string;
let token: string;

beforeAll(async () => {
  t = await buildTestApp();
  token = await makeToken(t, ['ingest', 'read']);
  server = http.createServer(t.app);
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
  endpoint = `http://127.0.0.1:${(server.address() as { port: number }).port}/v1/metrics`;
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
  await t.close();
});

const BOUNDS = [10, 50, 100, 250, 500, 1000];
// Three export phases. Every series gets a recording in every phase, so delta exports carry a
// point for each series each time (the SDK omits series with nothing new under delta).
const PHASES = [
  { requests: { '/pay': 5, '/search': 3 }, errors: { '/pay': 1, '/search': 1 }, queue: 10, disk: 500, latency: [5, 12, 30, 45, 60, 120] },
  { requests: { '/pay': 7, '/search': 2 }, errors: { '/pay': 2, '/search': 1 }, queue: -4, disk: 450, latency: [12, 30, 45, 60, 75, 90, 120, 180, 240, 300, 420, 700] },
  { requests: { '/pay': 4, '/search': 1 }, errors: { '/pay': 1, '/search': 1 }, queue: 1, disk: 420, latency: [15, 25, 55, 65, 95, 110, 130, 160, 200, 230, 260, 480, 900, 1500] },
];

/** Wraps an exporter to keep each export's result (the reader itself only logs failures). */
function recording(inner: PushMetricExporter, results: number[]): PushMetricExporter {
  return {
    export: (m: ResourceMetrics, cb) => inner.export(m, (r) => (results.push(r.code), cb(r))),
    forceFlush: () => inner.forceFlush(),
    shutdown: () => inner.shutdown(),
    selectAggregationTemporality: inner.selectAggregationTemporality?.bind(inner),
    selectAggregation: inner.selectAggregation?.bind(inner),
  };
}

async function runSdk(service: string, encoding: 'json' | 'protobuf', temporality: 'cumulative' | 'delta', gzip: boolean) {
  const opts = {
    url: endpoint,
    headers: { authorization: `Bearer ${token}` },
    temporalityPreference: temporality === 'delta' ? AggregationTemporalityPreference.DELTA : AggregationTemporalityPreference.CUMULATIVE,
    ...(gzip ? { compression: CompressionAlgorithm.GZIP } : {}),
  };
  const results: number[] = [];
  const exporter = recording(encoding === 'json' ? new JsonExporter(opts) : new ProtoExporter(opts), results);
  const provider = new MeterProvider({
    resource: resourceFromAttributes({ 'service.name': service, 'service.instance.id': 'i-1' }),
    // A long interval: exports happen when the test flushes, nothing in between.
    readers: [new PeriodicExportingMetricReader({ exporter, exportIntervalMillis: 3_600_000 })],
  });
  const meter = provider.getMeter('parallax-interop');
  const requests = meter.createCounter('http.server.requests', { unit: '{request}' });
  const errors = meter.createCounter('http.server.errors', { unit: '{request}' });
  const queue = meter.createUpDownCounter('queue.items', { valueType: ValueType.INT });
  const latency = meter.createHistogram('http.server.duration', { unit: 'ms', advice: { explicitBucketBoundaries: BOUNDS } });
  let disk = 0;
  meter.createObservableGauge('disk.free', { unit: 'By' }).addCallback((r) => r.observe(disk, { mount: '/' }));

  const start = Date.now();
  for (const phase of PHASES) {
    for (const [route, n] of Object.entries(phase.requests)) requests.add(n, { route });
    for (const [route, n] of Object.entries(phase.errors)) errors.add(n, { route });
    queue.add(phase.queue);
    disk = phase.disk;
    for (const v of phase.latency) latency.record(v, { route: '/pay' });
    await provider.forceFlush();
    // Distinct export instants, a few milliseconds apart.
    await new Promise((r) => setTimeout(r, 20));
  }
  await provider.shutdown();
  return { start, end: Date.now(), results };
}

/** Grouped-data percentile L + ((p·N − F)/f)·w over the buckets (NCERT Class X ch. 14; REFERENCES.md). */
function groupedQuantile(values: number[], p: number): number {
  const counts = new Array(BOUNDS.length + 1).fill(0);
  for (const v of values) counts[BOUNDS.findIndex((b) => v <= b) === -1 ? BOUNDS.length : BOUNDS.findIndex((b) => v <= b)]++;
  const rank = p * values.length;
  let below = 0;
  for (let i = 0; i < counts.length; i++) {
    if (counts[i] > 0 && below + counts[i] >= rank) {
      const lower = i === 0 ? 0 : BOUNDS[i - 1]!;
      return lower + ((rank - below) / counts[i]) * (BOUNDS[i]! - lower);
    }
    below += counts[i];
  }
  throw new Error('rank beyond the buckets');
}

const CASES = [
  { encoding: 'json', temporality: 'cumulative', gzip: false },
  { encoding: 'json', temporality: 'delta', gzip: true },
  { encoding: 'protobuf', temporality: 'cumulative', gzip: false },
  { encoding: 'protobuf', temporality: 'delta', gzip: false },
] as const;

describe.each(CASES)('OpenTelemetry JS SDK → /v1/metrics ($encoding, $temporality)', ({ encoding, temporality, gzip }) => {
  const service = `sdk-${encoding}-${temporality}`;
  let run: { start: number; end: number; results: number[] };
  // One aligned instant after the last export whose window reaches back before the first.
  let params: Record<string, string | number>;
  let windowS: number;

  beforeAll(async () => {
    run = await runSdk(service, encoding, temporality, gzip);
    const step = 600_000;
    const at = Math.ceil((run.end + 1) / step) * step;
    const windowMs = at - run.start + 1000;
    windowS = windowMs / 1000;
    params = { service, from: at, to: at, step: `${step}ms`, window: `${windowMs}ms` };
  });

  const q = (extra: Record<string, string | number>) =>
    request(t.app)
      .get('/api/signals/query')
      .set('authorization', `Bearer ${token}`)
      .query({ ...params, ...extra });
  const valuesByLabel = (body: { groups: { labels: Record<string, string>; points: { v: number | null }[] }[] }, label: string) =>
    Object.fromEntries(body.groups.map((g) => [g.labels[label], g.points[0]!.v]));

  it('every export was accepted', () => {
    // Three flushes, plus the final collection on shutdown; ExportResultCode.SUCCESS is 0.
    expect(run.results.length).toBeGreaterThanOrEqual(3);
    expect(run.results.every((code) => code === 0)).toBe(true);
  });

  it('counter increase and rate per route', async () => {
    // Growth after the first export: /pay 7 + 4, /search 2 + 1.
    const inc = await q({ signal: 'http.server.requests', fn: 'increase', by: 'route' });
    expect(inc.status).toBe(200);
    expect(valuesByLabel(inc.body, 'route')).toEqual({ '/pay': 11, '/search': 3 });
    expect(inc.body.kind).toBe('counter');
    expect(inc.body.series.map((s: { labels: Record<string, string> }) => s.labels).sort((a: { route: string }, b: { route: string }) => a.route.localeCompare(b.route))).toEqual([
      { route: '/pay', 'service.instance.id': 'i-1' },
      { route: '/search', 'service.instance.id': 'i-1' },
    ]);
    const rate = await q({ signal: 'http.server.requests', fn: 'rate', by: 'route' });
    const r = valuesByLabel(rate.body, 'route');
    expect(r['/pay']).toBeCloseTo(11 / windowS, 12);
    expect(r['/search']).toBeCloseTo(3 / windowS, 12);
  });

  it('error ratio per route and overall', async () => {
    // Errors after the first export: /pay 2 + 1 = 3 of 11 requests, /search 1 + 1 = 2 of 3.
    const res = await q({ signal: 'http.server.errors', fn: 'ratio', denominator: 'http.server.requests', by: 'route' });
    const r = valuesByLabel(res.body, 'route');
    expect(r['/pay']).toBeCloseTo(3 / 11, 12);
    expect(r['/search']).toBeCloseTo(2 / 3, 12);
    const all = await q({ signal: 'http.server.errors', fn: 'ratio', denominator: 'http.server.requests' });
    expect(all.body.groups[0].points[0].v).toBeCloseTo(5 / 14, 12);
  });

  it('up-down counter and observable gauge read as gauges with their latest value', async () => {
    const queue = await q({ signal: 'queue.items', fn: 'last', by: '' });
    expect(queue.body.kind).toBe('gauge');
    expect(queue.body.groups[0].points[0].v).toBe(10 - 4 + 1);
    const disk = await q({ signal: 'disk.free', fn: 'last' });
    expect(disk.body.groups).toEqual([expect.objectContaining({ labels: { mount: '/', 'service.instance.id': 'i-1' }, points: [{ t: params.to, v: 420 }] })]);
  });

  it('latency quantiles and share above a bound from the explicit buckets', async () => {
    // The window's growth holds the observations of phases 2 and 3.
    const observed = [...PHASES[1]!.latency, ...PHASES[2]!.latency];
    for (const p of [0.5, 0.9]) {
      const res = await q({ signal: 'http.server.duration', fn: 'quantile', q: p, by: 'route' });
      expect(res.status).toBe(200);
      const v = res.body.groups[0].points[0].v as number;
      expect(v).toBeCloseTo(groupedQuantile(observed, p), 9);
      // Reference library on the raw observations (simple-statistics): within one bucket width
      // of the estimate (DESIGN.md §6).
      const raw = ss.quantile(observed, p);
      const bucket = BOUNDS.findIndex((b) => raw <= b);
      const width = BOUNDS[bucket]! - (bucket === 0 ? 0 : BOUNDS[bucket - 1]!);
      expect(Math.abs(v - raw)).toBeLessThanOrEqual(width);
    }
    const share = await q({ signal: 'http.server.duration', fn: 'share_above', bound: 250 });
    // Exact at an explicit bound: observations above 250 ms among phases 2 and 3.
    expect(share.body.groups[0].points[0].v).toBeCloseTo(observed.filter((x) => x > 250).length / observed.length, 12);
  });
});
