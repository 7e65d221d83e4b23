// The protobuf side of the OTLP intake (server/ingest/otlp-protobuf.ts): requests decoded with
// protobufjs from the schema in otlp-metrics.proto.ts must give the same plain shape, and so the
// same points, as the OTLP/JSON encoding of the same request (OpenTelemetry Protocol
// specification, "JSON Protobuf Encoding": lowerCamelCase keys, enums as integers, 64-bit
// integers as decimal strings, bytes as base64).
//
// Three checks of the schema's field numbers, from the least to the most independent: a round
// trip through protobufjs with the same schema (catches type mistakes: int64 vs fixed64, optional,
// packed); bytes written field by field with protobufjs's Writer after the published field numbers
// (from memory, opentelemetry-proto metrics/v1/metrics.proto); and requests serialised by
// @opentelemetry/otlp-transformer, the OpenTelemetry JS SDK's own hand-written encoder.
import { ValueType } from '@opentelemetry/api';
import { ProtobufMetricsSerializer } from '@opentelemetry/otlp-transformer';
import { deserializeExportMetricsServiceResponse } from '@opentelemetry/otlp-transformer/build/src/metrics/protobuf/response-deserializer';
import { resourceFromAttributes } from '@opentelemetry/resources';
import { AggregationTemporality, DataPointType } from '@opentelemetry/sdk-metrics';
import protobuf from 'protobufjs';
import { describe, expect, it } from 'vitest';
import { normalizeExportRequest } from '../../../server/ingest/otlp-normalize';
import {
  decodeExportMetricsRequest,
  encodeExportMetricsResponse,
  encodeStatus,
  ExportMetricsServiceRequest,
  ProtobufDecodeError,
} from '../../../server/ingest/otlp-protobuf';

const T0 = Date.UTC(2026, 0, 5, 12, 0, 0);
/** ms → fixed64 nanoseconds as proto3 JSON writes them. */
const ns = (ms: number) => `${BigInt(ms) * 1_000_000n}`;

// A request touching every field the intake reads, in the canonical proto3 JSON form protobufjs
// gives back (int64 as strings, bytes as base64, default values absent).
const REQUEST = {
  resourceMetrics: [
    {
      resource: {
        attributes: [
          { key: 'service.name', value: { stringValue: 'checkout' } },
          { key: 'service.instance.id', value: { stringValue: 'i-7' } },
        ],
      },
      scopeMetrics: [
        {
          scope: { name: 'tests', version: '1.2.3' },
          metrics: [
            {
              name: 'http.requests',
              description: 'Requests served',
              unit: '{request}',
              sum: {
                aggregationTemporality: 2,
                isMonotonic: true,
                dataPoints: [
                  {
                    attributes: [
                      { key: 'route', value: { stringValue: '/pay' } },
                      { key: 'retry', value: { boolValue: true } },
                      { key: 'shard', value: { intValue: '-3' } },
                      { key: 'weight', value: { doubleValue: 0.25 } },
                      { key: 'tags', value: { arrayValue: { values: [{ stringValue: 'a' }, { intValue: '9007199254740993' }] } } },
                      { key: 'peer', value: { kvlistValue: { values: [{ key: 'zone', value: { stringValue: 'z1' } }] } } },
                      { key: 'token', value: { bytesValue: Buffer.from([0xde, 0xad, 0xbe, 0xef]).toString('base64') } },
                    ],
                    startTimeUnixNano: ns(T0 - 60_000),
                    timeUnixNano: '1767614400123456789',
                    asInt: '42',
                  },
                ],
              },
            },
            {
              name: 'queue.items',
              sum: { aggregationTemporality: 1, dataPoints: [{ timeUnixNano: ns(T0), asInt: '-5' }] },
            },
            { name: 'temp', unit: 'Cel', gauge: { dataPoints: [{ timeUnixNano: ns(T0), asDouble: 21.5 }, { timeUnixNano: ns(T0 + 1000), asDouble: 22, flags: 1 }] } },
            {
              name: 'latency',
              unit: 'ms',
              histogram: {
                aggregationTemporality: 2,
                dataPoints: [
                  { timeUnixNano: ns(T0), count: '6', sum: 950.5, bucketCounts: ['1', '2', '3'], explicitBounds: [10, 100], min: 1, max: 400 },
                  // No sum: it must stay absent (optional double), not become 0.
                  { timeUnixNano: ns(T0 + 1000), count: '2', bucketCounts: ['2', '0', '0'], explicitBounds: [10, 100] },
                  { timeUnixNano: ns(T0 + 2000), count: '0', sum: 0, bucketCounts: ['0', '0', '0'], explicitBounds: [10, 100] },
                ],
              },
            },
            { name: 'sizes', exponentialHistogram: { aggregationTemporality: 2, dataPoints: [{ timeUnixNano: ns(T0), count: '4' }] } },
            { name: 'rpc', summary: { dataPoints: [{ timeUnixNano: ns(T0), count: '2', sum: 3 }, { timeUnixNano: ns(T0), count: '1', sum: 1 }] } },
          ],
        },
      ],
    },
  ],
};

const encode = (req: object) => ExportMetricsServiceRequest.encode(ExportMetricsServiceRequest.fromObject(req)).finish();

describe('OTLP protobuf decoding (protobufjs)', () => {
  it('round-trips a hand-built request through protobuf.encode into the proto3 JSON shape', () => {
    expect(decodeExportMetricsRequest(encode(REQUEST))).toEqual(REQUEST);
  });

  it('feeds the same normaliser as OTLP/JSON: one mapping, same points and rejections', () => {
    const fromProto = normalizeExportRequest(decodeExportMetricsRequest(encode(REQUEST)));
    const fromJson = normalizeExportRequest(JSON.parse(JSON.stringify(REQUEST)));
    expect(fromProto).toEqual(fromJson);
    // Counter, up-down counter (delta sum), 1 gauge point (the other is flagged "no recorded value"),
    // 3 histogram points; exponential histogram and summary points are rejected by count.
    expect(fromProto.points.map((p) => [p.signal, p.kind, p.value])).toEqual([
      ['http.requests', 'counter', 42],
      ['queue.items', 'gauge', -5],
      ['temp', 'gauge', 21.5],
      ['latency', 'histogram', 6],
      ['latency', 'histogram', 2],
      ['latency', 'histogram', 0],
    ]);
    expect(fromProto.skipped).toBe(1);
    expect([...fromProto.rejected]).toEqual([
      ['exponential histograms are not supported', 1],
      ['summaries are not supported', 2],
    ]);
    const [counter] = fromProto.points;
    expect(counter!.labels).toEqual({
      peer: '{"zone":"z1"}',
      retry: 'true',
      route: '/pay',
      'service.instance.id': 'i-7',
      shard: '-3',
      tags: '["a","9007199254740993"]',
      token: '3q2+7w==',
      weight: '0.25',
    });
    // Nanoseconds past the microsecond are below storage precision.
    expect(counter!.t).toBe(1767614400123.456);
    expect(fromProto.points.slice(3).map((p) => p.hist!.sum)).toEqual([950.5, null, 0]);
    expect(fromProto.points[3]!.hist).toEqual({ bounds: [10, 100], counts: [1, 2, 3], sum: 950.5, count: 6 });
  });

  it('reads fields written one by one after the published field numbers', () => {
    // NumberDataPoint { time_unix_nano 3 fixed64, as_int 6 sfixed64, flags 8 uint32, attributes 7 };
    // Sum { data_points 1, aggregation_temporality 2, is_monotonic 3 }; Metric { name 1, sum 7 };
    // ScopeMetrics { metrics 2 }; ResourceMetrics { resource 1, scope_metrics 2 };
    // Resource { attributes 1 }; KeyValue { key 1, value 2 }; AnyValue { string_value 1 };
    // ExportMetricsServiceRequest { resource_metrics 1 }. Wire types: 0 varint, 1 i64, 2 len.
    const W = protobuf.Writer;
    const kv = (key: string, value: string) => W.create().uint32((1 << 3) | 2).string(key).uint32((2 << 3) | 2).fork().uint32((1 << 3) | 2).string(value).ldelim();
    const point = W.create()
      .uint32((3 << 3) | 1)
      .fixed64(ns(T0))
      .uint32((6 << 3) | 1)
      .sfixed64(-7)
      .uint32((7 << 3) | 2)
      .bytes(kv('code', '500').finish())
      .uint32((8 << 3) | 0)
      .uint32(0);
    const sum = W.create().uint32((1 << 3) | 2).bytes(point.finish()).uint32((2 << 3) | 0).int32(2).uint32((3 << 3) | 0).bool(false);
    const metric = W.create().uint32((1 << 3) | 2).string('balance').uint32((7 << 3) | 2).bytes(sum.finish());
    const scope = W.create().uint32((2 << 3) | 2).bytes(metric.finish());
    const resource = W.create().uint32((1 << 3) | 2).bytes(kv('service.name', 'ledger').finish());
    const rm = W.create().uint32((1 << 3) | 2).bytes(resource.finish()).uint32((2 << 3) | 2).bytes(scope.finish());
    const bytes = W.create().uint32((1 << 3) | 2).bytes(rm.finish()).finish();

    const { points } = normalizeExportRequest(decodeExportMetricsRequest(bytes));
    expect(points).toEqual([expect.objectContaining({ service: 'ledger', signal: 'balance', kind: 'gauge', labels: { code: '500' }, t: T0, value: -7, delta: false })]);
  });

  it('decodes what the OpenTelemetry JS SDK serialises (an independent encoder)', () => {
    const hr = (ms: number): [number, number] => [Math.floor(ms / 1000), (ms % 1000) * 1e6];
    const bytes = ProtobufMetricsSerializer.serializeRequest({
      resource: resourceFromAttributes({ 'service.name': 'sdk-svc', 'service.instance.id': 'i-1' }),
      scopeMetrics: [
        {
          scope: { name: 'tests', version: '1' },
          metrics: [
            {
              descriptor: { name: 'queue.items', description: '', unit: '1', valueType: ValueType.INT },
              aggregationTemporality: AggregationTemporality.CUMULATIVE,
              dataPointType: DataPointType.SUM,
              isMonotonic: false,
              dataPoints: [{ startTime: hr(T0 - 1000), endTime: hr(T0 + 250), attributes: { queue: 'mail', urgent: true, tries: 3, load: 0.5 }, value: -12 }],
            },
            {
              descriptor: { name: 'http.duration', description: 'Latency', unit: 'ms', valueType: ValueType.DOUBLE },
              aggregationTemporality: AggregationTemporality.DELTA,
              dataPointType: DataPointType.HISTOGRAM,
              dataPoints: [
                {
                  startTime: hr(T0 - 1000),
                  endTime: hr(T0),
                  attributes: { route: '/pay' },
                  value: { buckets: { boundaries: [10, 50, 100], counts: [4, 0, 2, 1] }, sum: 812.25, count: 7, min: 2, max: 420 },
                },
              ],
            },
            {
              descriptor: { name: 'bytes', description: '', unit: 'By', valueType: ValueType.DOUBLE },
              aggregationTemporality: AggregationTemporality.CUMULATIVE,
              dataPointType: DataPointType.EXPONENTIAL_HISTOGRAM,
              dataPoints: [
                {
                  startTime: hr(T0 - 1000),
                  endTime: hr(T0),
                  attributes: {},
                  value: { count: 3, sum: 10, scale: 1, zeroCount: 0, positive: { offset: 0, bucketCounts: [1, 2] }, negative: { offset: 0, bucketCounts: [] }, min: 1, max: 7 },
                },
              ],
            },
          ],
        },
      ],
    })!;
    const decoded = decodeExportMetricsRequest(bytes) as typeof REQUEST;
    const metrics = decoded.resourceMetrics[0]!.scopeMetrics[0]!.metrics as Array<Record<string, unknown>>;
    expect(metrics[0]).toMatchObject({
      name: 'queue.items',
      unit: '1',
      sum: { aggregationTemporality: 2, dataPoints: [{ startTimeUnixNano: ns(T0 - 1000), timeUnixNano: ns(T0 + 250), asInt: '-12' }] },
    });
    expect(metrics[1]).toMatchObject({
      name: 'http.duration',
      description: 'Latency',
      histogram: {
        aggregationTemporality: 1,
        dataPoints: [{ timeUnixNano: ns(T0), count: '7', sum: 812.25, bucketCounts: ['4', '0', '2', '1'], explicitBounds: [10, 50, 100], min: 2, max: 420 }],
      },
    });

    const { points, rejected } = normalizeExportRequest(decoded);
    expect(points).toEqual([
      expect.objectContaining({
        service: 'sdk-svc',
        signal: 'queue.items',
        kind: 'gauge',
        labels: { load: '0.5', queue: 'mail', 'service.instance.id': 'i-1', tries: '3', urgent: 'true' },
        t: T0 + 250,
        value: -12,
        delta: false,
      }),
      expect.objectContaining({
        signal: 'http.duration',
        kind: 'histogram',
        unit: 'ms',
        t: T0,
        delta: true,
        hist: { bounds: [10, 50, 100], counts: [4, 0, 2, 1], sum: 812.25, count: 7 },
      }),
    ]);
    expect([...rejected]).toEqual([['exponential histograms are not supported', 1]]);
  });

  it('refuses malformed bytes with ProtobufDecodeError', () => {
    // Field 1, length-delimited, claiming 65 535 bytes where 1 follows.
    expect(() => decodeExportMetricsRequest(Uint8Array.from([0x0a, 0xff, 0xff, 0x03, 0x01]))).toThrow(ProtobufDecodeError);
    // Wire type 7 does not exist.
    expect(() => decodeExportMetricsRequest(Uint8Array.from([0x0f]))).toThrow(ProtobufDecodeError);
    // An empty body is a valid, empty request.
    expect(decodeExportMetricsRequest(new Uint8Array())).toEqual({});
  });
});

describe('OTLP protobuf answers', () => {
  it('encodes ExportMetricsServiceResponse with partial success as the SDK reads it', () => {
    const bytes = encodeExportMetricsResponse({ rejectedDataPoints: 3, errorMessage: '3 data points rejected: NaN or infinite value (3)' });
    expect(deserializeExportMetricsServiceResponse(bytes)).toEqual({ partialSuccess: { rejectedDataPoints: 3, errorMessage: '3 data points rejected: NaN or infinite value (3)' } });
    // Full success: an empty message, zero bytes.
    expect(encodeExportMetricsResponse()).toHaveLength(0);
  });

  it('encodes google.rpc.Status { code 1, message 2 }', () => {
    // Tag 0x08 (field 1, varint) 3; tag 0x12 (field 2, length-delimited) length 3 "bad".
    expect([...encodeStatus(3, 'bad')]).toEqual([0x08, 0x03, 0x12, 0x03, 0x62, 0x61, 0x64]);
  });
});
