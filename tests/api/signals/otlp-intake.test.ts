// POST /v1/metrics with hand-built requests: answers per the OTLP specification (OTLP/HTTP:
// 200, 200 + partialSuccess, 400, 413, 429/503 with Retry-After), authorisation, storage mapping,
// idempotency and delta accumulation.
import http from 'node:http';
import zlib from 'node:zlib';
import { deserializeExportMetricsServiceResponse } from '@opentelemetry/otlp-transformer/build/src/metrics/protobuf/response-deserializer';
import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { otlpMetricsRoutes } from '../../../server/ingest/otlp-routes';
import { buildTestApp, type TestApp } from '../../helpers/app';
import { CUMULATIVE, DELTA, exportRequest, gaugeMetric, histogramMetric, makeToken, sumMetric } from './otlp-fixtures';

let t: TestApp;
let ingest: string;
let readOnly: string;
const T0 = Date.UTC(2026, 0, 5, 12, 0, 0);

beforeAll(async () => {
  t = await buildTestApp({ log: (m, e) => console.error('[intake test]', m, e) });
  ingest = await makeToken(t, ['ingest']);
  readOnly = await makeToken(t, ['read'], 'reader');
});
afterAll(() => t.close());

// superagent would JSON-encode a Buffer sent as application/json; send the bytes as they are.
const asIs = (b: unknown) => b as string;

const post = (body: unknown, token = ingest) =>
  request(t.app).post('/v1/metrics').set('authorization', `Bearer ${token}`).set('content-type', 'application/json').send(JSON.stringify(body));

async function samplesOf(service: string, signal: string) {
  const rows = await t.db.knex.raw(
    `SELECT x.labels, extract(epoch FROM s.t) * 1000 AS ms, s.value FROM samples s
     JOIN series x ON x.id = s.series_id JOIN signals g ON g.id = x.signal_id JOIN services v ON v.id = g.service_id
     WHERE v.name = ? AND g.name = ? ORDER BY x.id, s.t`,
    [service, signal],
  );
  return (rows.rows as { labels: Record<string, string>; ms: string; value: number }[]).map((r) => ({ labels: r.labels, t: Number(r.ms), value: r.value }));
}

describe('OTLP intake: who may send', () => {
  it('answers 401 without a token or with an unknown one, 403 without scope ingest', async () => {
    const body = exportRequest('auth-svc', [gaugeMetric('g', [{ t: T0, value: 1 }])]);
    const none = await request(t.app).post('/v1/metrics').set('content-type', 'application/json').send(JSON.stringify(body));
    expect(none.status).toBe(401);
    expect((await post(body, 'plx_not-a-real-token')).status).toBe(401);
    const wrong = await post(body, readOnly);
    expect(wrong.status).toBe(403);
    expect(wrong.body.message).toMatch(/ingest/);
    expect(await samplesOf('auth-svc', 'g')).toEqual([]);
  });
});

describe('OTLP intake: mapping to services, signals and series', () => {
  it('stores counters, gauges and histograms with their labels, and creates the service on first sight', async () => {
    const body = exportRequest(
      'checkout',
      [
        sumMetric('http.requests', [
          { t: T0, value: '12', int: true, labels: { route: '/pay', code: '200' } },
          { t: T0, value: 3, int: true, labels: { code: '500', route: '/pay' } },
        ]),
        sumMetric('queue.depth', [{ t: T0, value: 4.5 }], { monotonic: false }),
        gaugeMetric('disk.free', [{ t: T0, value: 1.5e9 }], 'By'),
        histogramMetric('http.latency', [{ t: T0, bounds: [10, 100], counts: [1, 2, 3], sum: 950.5 }]),
      ],
      { 'service.instance.id': 'i-1' },
    );
    const res = await post(body);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({});

    const signals = await t.db.knex('signals as g').join('services as s', 's.id', 'g.service_id').where('s.name', 'checkout').select('g.name', 'g.kind', 'g.unit').orderBy('g.name');
    expect(signals).toEqual([
      { name: 'disk.free', kind: 'gauge', unit: 'By' },
      { name: 'http.latency', kind: 'histogram', unit: 'ms' },
      { name: 'http.requests', kind: 'counter', unit: '1' },
      { name: 'queue.depth', kind: 'gauge', unit: '1' },
    ]);
    const requests = await samplesOf('checkout', 'http.requests');
    expect(requests).toEqual([
      { labels: { code: '200', route: '/pay', 'service.instance.id': 'i-1' }, t: T0, value: 12 },
      { labels: { code: '500', route: '/pay', 'service.instance.id': 'i-1' }, t: T0, value: 3 },
    ]);
    const h = await t.db.knex('histogram_points').first();
    expect(h).toMatchObject({ bounds: [10, 100], counts: ['1', '2', '3'], sum: 950.5, count: 6 });
  });

  it('accepts integers and times as JSON numbers as well as strings', async () => {
    const body = exportRequest('numbers', [sumMetric('c', [{ t: T0, value: 7, int: true }])]);
    const dp = (body.resourceMetrics[0]!.scopeMetrics[0]!.metrics[0] as { sum: { dataPoints: Record<string, unknown>[] } }).sum.dataPoints[0]!;
    dp.timeUnixNano = T0 * 1e6;
    expect((await post(body)).status).toBe(200);
    expect(await samplesOf('numbers', 'c')).toEqual([{ labels: {}, t: T0, value: 7 }]);
  });

  it('reads UTF-8 JSON bodies as well as plain ASCII ones', async () => {
    const body = exportRequest('café', [gaugeMetric('temp', [{ t: T0, value: 21, labels: { city: 'Zürich', note: 'naïve ✓' } }])]);
    const res = await post(body);
    expect(res.status).toBe(200);
    expect(await samplesOf('café', 'temp')).toEqual([{ labels: { city: 'Zürich', note: 'naïve ✓' }, t: T0, value: 21 }]);
  });

  it('stores a re-sent request once (the unique key makes retries idempotent)', async () => {
    const body = exportRequest('retry', [sumMetric('c', [{ t: T0, value: 1 }, { t: T0 + 1000, value: 2, labels: { a: 'b' } }])]);
    expect((await post(body)).status).toBe(200);
    expect((await post(body)).status).toBe(200);
    expect(await samplesOf('retry', 'c')).toHaveLength(2);
  });

  it('accumulates delta points into a cumulative series, ignores their retries and refuses out-of-order ones', async () => {
    const send = (points: { t: number; value: number }[]) => post(exportRequest('delta', [sumMetric('hits', points, { temporality: DELTA })]));
    expect((await send([{ t: T0, value: 5 }])).status).toBe(200);
    expect((await send([{ t: T0 + 10_000, value: 7 }, { t: T0 + 20_000, value: 3 }])).body).toEqual({});
    // The same export again (an OTLP retry): nothing changes, nothing is rejected.
    expect((await send([{ t: T0 + 10_000, value: 7 }, { t: T0 + 20_000, value: 3 }])).body).toEqual({});
    expect((await samplesOf('delta', 'hits')).map((s) => s.value)).toEqual([5, 12, 15]);
    const late = await send([{ t: T0 + 15_000, value: 1 }]);
    expect(late.body.partialSuccess.rejectedDataPoints).toBe('1');
    expect(late.body.partialSuccess.errorMessage).toMatch(/time order/);

    const hist = (t0: number, counts: number[]) =>
      post(exportRequest('delta', [histogramMetric('lat', [{ t: t0, bounds: [1, 2], counts, sum: 1 }], DELTA)]));
    await hist(T0, [1, 0, 0]);
    await hist(T0 + 10_000, [0, 2, 1]);
    const rows = await t.db.knex('histogram_points').join('series', 'series.id', 'histogram_points.series_id').join('signals', 'signals.id', 'series.signal_id').where('signals.name', 'lat').orderBy('t');
    expect(rows.map((r) => r.counts.map(Number))).toEqual([
      [1, 0, 0],
      [1, 2, 1],
    ]);
    expect(rows.map((r) => [r.sum, r.count])).toEqual([
      [1, 1],
      [2, 4],
    ]);
  });

  it('refuses points of a signal whose kind changed, keeping the rest', async () => {
    await post(exportRequest('kinds', [sumMetric('x', [{ t: T0, value: 1 }])]));
    const res = await post(exportRequest('kinds', [gaugeMetric('x', [{ t: T0 + 1000, value: 1 }]), gaugeMetric('y', [{ t: T0, value: 1 }])]));
    expect(res.body.partialSuccess).toMatchObject({ rejectedDataPoints: '1' });
    expect(res.body.partialSuccess.errorMessage).toMatch(/stored as a counter/);
    expect(await samplesOf('kinds', 'y')).toHaveLength(1);
  });
});

describe('OTLP intake: partial success and bad input', () => {
  it('rejects NaN and infinite values with their count and keeps the good points', async () => {
    const res = await post(
      exportRequest('nan', [
        gaugeMetric('g', [
          { t: T0, value: 'NaN' },
          { t: T0 + 1000, value: 'Infinity' },
          { t: T0 + 2000, value: '-Infinity' },
          { t: T0 + 3000, value: 2.5 },
        ]),
      ]),
    );
    expect(res.status).toBe(200);
    expect(res.body.partialSuccess.rejectedDataPoints).toBe('3');
    expect(res.body.partialSuccess.errorMessage).toMatch(/NaN or infinite value \(3\)/);
    expect((await samplesOf('nan', 'g')).map((s) => s.value)).toEqual([2.5]);
  });

  it('rejects histogram points whose bucket counts do not match the bounds', async () => {
    const res = await post(
      exportRequest('buckets', [
        histogramMetric('h', [
          { t: T0, bounds: [1, 2, 3], counts: [1, 1, 1] },
          { t: T0 + 1000, bounds: [1, 2, 3], counts: [1, 1, 1, 1] },
        ]),
      ]),
    );
    expect(res.status).toBe(200);
    expect(res.body.partialSuccess).toEqual({ rejectedDataPoints: '1', errorMessage: expect.stringMatching(/bucket count mismatch/) });
    expect(await t.db.knex('histogram_points').join('series', 'series.id', 'histogram_points.series_id').join('signals', 'signals.id', 'series.signal_id').where('signals.name', 'h').count({ n: '*' }).first()).toEqual({ n: 1 });
  });

  it('answers 400 for malformed JSON and for the wrong types, naming where', async () => {
    const bad = await request(t.app).post('/v1/metrics').set('authorization', `Bearer ${ingest}`).set('content-type', 'application/json').send('{"resourceMetrics": [');
    expect(bad.status).toBe(400);
    expect(bad.body.code).toBe(3); // google.rpc.Code INVALID_ARGUMENT
    const wrongType = await post({ resourceMetrics: [{ scopeMetrics: [{ metrics: [{ name: 'x', gauge: { dataPoints: { not: 'a list' } } }] }] }] });
    expect(wrongType.status).toBe(400);
    expect(wrongType.body.error.field).toBe('resourceMetrics.0.scopeMetrics.0.metrics.0.gauge.dataPoints');
    const badTime = await post(exportRequest('x', [{ name: 'x', gauge: { dataPoints: [{ timeUnixNano: 'yesterday', asDouble: 1 }] } }]));
    expect(badTime.status).toBe(400);
    expect(badTime.body.error.field).toMatch(/dataPoints\.0\.timeUnixNano$/);
  });

  it('answers 400 with a protobuf Status for malformed protobuf', async () => {
    const res = await request(t.app)
      .post('/v1/metrics')
      .set('authorization', `Bearer ${ingest}`)
      .set('content-type', 'application/x-protobuf')
      .send(Buffer.from([0x0a, 0xff, 0xff, 0x03, 0x01]));
    expect(res.status).toBe(400);
    expect(res.headers['content-type']).toMatch(/application\/x-protobuf/);
  });

  it('answers 415 for other content types', async () => {
    const res = await request(t.app).post('/v1/metrics').set('authorization', `Bearer ${ingest}`).set('content-type', 'text/plain').send('hello');
    expect(res.status).toBe(415);
  });

  it('takes gzip bodies', async () => {
    const body = zlib.gzipSync(JSON.stringify(exportRequest('gzip', [gaugeMetric('g', [{ t: T0, value: 9 }])])));
    const res = await request(t.app)
      .post('/v1/metrics')
      .set('authorization', `Bearer ${ingest}`)
      .set('content-type', 'application/json')
      .set('content-encoding', 'gzip')
      .serialize(asIs)
      .send(body);
    expect(res.status).toBe(200);
    expect((await samplesOf('gzip', 'g')).map((s) => s.value)).toEqual([9]);
  });

  it('answers 413 for a 25 MiB body, and for a small gzip body that inflates past 20 MiB', async () => {
    const big = Buffer.alloc(25 * 1024 * 1024, 0x20);
    const res = await request(t.app).post('/v1/metrics').set('authorization', `Bearer ${ingest}`).set('content-type', 'application/json').serialize(asIs).send(big);
    expect(res.status).toBe(413);
    const bomb = zlib.gzipSync(Buffer.alloc(25 * 1024 * 1024, 0x20));
    expect(bomb.length).toBeLessThan(100 * 1024);
    const res2 = await request(t.app)
      .post('/v1/metrics')
      .set('authorization', `Bearer ${ingest}`)
      .set('content-type', 'application/json')
      .set('content-encoding', 'gzip')
      .serialize(asIs)
      .send(bomb);
    expect(res2.status).toBe(413);
  });

  it('answers protobuf requests in protobuf, with partial success encoded', async () => {
    const { ProtobufMetricsSerializer } = await import('@opentelemetry/otlp-transformer');
    const { resourceFromAttributes } = await import('@opentelemetry/resources');
    const { AggregationTemporality, DataPointType } = await import('@opentelemetry/sdk-metrics');
    const { ValueType } = await import('@opentelemetry/api');
    const hr = (ms: number): [number, number] => [Math.floor(ms / 1000), (ms % 1000) * 1e6];
    const bytes = ProtobufMetricsSerializer.serializeRequest({
      resource: resourceFromAttributes({ 'service.name': 'proto-svc' }),
      scopeMetrics: [
        {
          scope: { name: 'tests' },
          metrics: [
            {
              descriptor: { name: 'temp', description: '', unit: 'Cel', valueType: ValueType.DOUBLE },
              aggregationTemporality: AggregationTemporality.CUMULATIVE,
              dataPointType: DataPointType.GAUGE,
              dataPoints: [
                { startTime: hr(T0), endTime: hr(T0), attributes: { room: 'a' }, value: 21.5 },
                { startTime: hr(T0), endTime: hr(T0 + 1000), attributes: { room: 'a' }, value: NaN },
              ],
            },
          ],
        },
      ],
    })!;
    const res = await request(t.app)
      .post('/v1/metrics')
      .set('authorization', `Bearer ${ingest}`)
      .set('content-type', 'application/x-protobuf')
      .send(Buffer.from(bytes))
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/x-protobuf/);
    const decoded = deserializeExportMetricsServiceResponse(new Uint8Array(res.body as Buffer));
    expect(decoded.partialSuccess).toEqual({ rejectedDataPoints: 1, errorMessage: expect.stringMatching(/NaN/) });
    expect(await samplesOf('proto-svc', 'temp')).toEqual([{ labels: { room: 'a' }, t: T0, value: 21.5 }]);
  });
});

describe('OTLP intake: shedding load', () => {
  it('answers 429 with Retry-After while the in-progress limit is reached', async () => {
    const app = express();
    app.use('/v1/metrics', otlpMetricsRoutes(t.db.knex, { maxInFlight: 1, log: (m, e) => console.error('[intake test]', m, e) }));
    const server = http.createServer(app);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', () => r()));
    const port = (server.address() as { port: number }).port;
    const body = JSON.stringify(exportRequest('shed', [gaugeMetric('g', [{ t: T0, value: 1 }])]));
    try {
      // The first request sends its headers and holds its body back, staying in progress.
      const first = http.request({ host: '127.0.0.1', port, method: 'POST', path: '/v1/metrics', headers: { authorization: `Bearer ${ingest}`, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } });
      const firstDone = new Promise<number>((resolve, reject) => {
        first.on('response', (r) => {
          r.resume();
          resolve(r.statusCode!);
        });
        first.on('error', reject);
      });
      first.flushHeaders();
      let second;
      // The first request is counted once it has reached the server; retry until it has.
      for (let i = 0; i < 50; i++) {
        second = await request(server).post('/v1/metrics').set('authorization', `Bearer ${ingest}`).set('content-type', 'application/json').send(body);
        if (second.status === 429) break;
        await new Promise((r) => setTimeout(r, 20));
      }
      expect(second!.status).toBe(429);
      expect(second!.headers['retry-after']).toBe('1');
      first.end(body);
      expect(await firstDone).toBe(200);
    } finally {
      await new Promise((r) => server.close(r));
    }
  });
});
