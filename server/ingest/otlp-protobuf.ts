// OTLP/HTTP protobuf: ExportMetricsServiceRequest → the same plain shape the JSON encoding parses to
// (so one normaliser serves both), and ExportMetricsServiceResponse / google.rpc.Status → bytes.
//
// protobufjs (or another general protobuf runtime with the OTLP .proto files) is not among the
// installed packages, so the wire format is read with the reader and written with the writer that
// @opentelemetry/otlp-transformer ships for its own response decoding and request encoding. This
// file only maps field numbers (opentelemetry-proto, metrics/v1/metrics.proto, common/v1/
// common.proto, collector/metrics/v1/metrics_service.proto) and reads the fixed-width scalars that
// reader has no method for (fixed64, sfixed64, double) from the bytes it points at.
import { ProtobufReader } from '@opentelemetry/otlp-transformer/build/src/common/protobuf/protobuf-reader';
import { ProtobufWriter } from '@opentelemetry/otlp-transformer/build/src/common/protobuf/protobuf-writer';

const VARINT = 0;
const I64 = 1;
const LEN = 2;
const I32 = 5;

export class ProtobufDecodeError extends Error {}

/** A reader over one message's bytes plus fixed-width reads at its position. */
class Msg {
  readonly r: ProtobufReader;
  private readonly view: DataView;
  constructor(private readonly buf: Uint8Array) {
    this.r = new ProtobufReader(buf);
    this.view = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
  }
  *fields(): Generator<{ field: number; wire: number }> {
    while (!this.r.isAtEnd()) {
      const { fieldNumber, wireType } = this.r.readTag();
      if (fieldNumber === 0) throw new ProtobufDecodeError('field number 0 is not valid protobuf');
      yield { field: fieldNumber, wire: wireType };
    }
  }
  private take(n: number): number {
    const at = this.r.pos;
    if (at + n > this.buf.length) throw new ProtobufDecodeError('truncated message');
    this.r.pos += n;
    return at;
  }
  fixed64(): bigint {
    return this.view.getBigUint64(this.take(8), true);
  }
  sfixed64(): bigint {
    return this.view.getBigInt64(this.take(8), true);
  }
  double(): number {
    return this.view.getFloat64(this.take(8), true);
  }
  bytes(): Uint8Array {
    return this.r.readBytes();
  }
  string(): string {
    return this.r.readString();
  }
  varint(): number {
    return this.r.readVarint();
  }
  skip(wire: number): void {
    if (wire === I64) this.take(8);
    else if (wire === I32) this.take(4);
    else this.r.skip(wire);
  }
  /** Repeated fixed64/double: packed (one LEN field) or one element per field. */
  repeated64(wire: number, read: (view: DataView, at: number) => number, into: number[]): void {
    if (wire === LEN) {
      const b = this.bytes();
      if (b.length % 8 !== 0) throw new ProtobufDecodeError('packed 64-bit field length is not a multiple of 8');
      const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
      for (let i = 0; i < b.length; i += 8) into.push(read(v, i));
    } else if (wire === I64) {
      into.push(read(this.view, this.take(8)));
    } else this.skip(wire);
  }
}

const sub = (m: Msg, wire: number) => {
  if (wire !== LEN) throw new ProtobufDecodeError('expected an embedded message');
  return new Msg(m.bytes());
};

type Plain = Record<string, unknown>;

function anyValue(m: Msg): Plain {
  const out: Plain = {};
  for (const { field, wire } of m.fields()) {
    if (field === 1 && wire === LEN) out.stringValue = m.string();
    else if (field === 2 && wire === VARINT) out.boolValue = m.varint() !== 0;
    // int64 as varint: two's complement negatives arrive as values ≥ 2^63.
    else if (field === 3 && wire === VARINT) {
      const v = m.varint();
      out.intValue = String(v >= 2 ** 63 ? v - 2 ** 64 : v);
    } else if (field === 4 && wire === I64) out.doubleValue = m.double();
    else if (field === 5 && wire === LEN) {
      const values: Plain[] = [];
      const arr = new Msg(m.bytes());
      for (const f of arr.fields()) if (f.field === 1) values.push(anyValue(sub(arr, f.wire)));
      else arr.skip(f.wire);
      out.arrayValue = { values };
    } else if (field === 6 && wire === LEN) {
      const values: Plain[] = [];
      const kv = new Msg(m.bytes());
      for (const f of kv.fields()) if (f.field === 1) values.push(keyValue(sub(kv, f.wire)));
      else kv.skip(f.wire);
      out.kvlistValue = { values };
    } else if (field === 7 && wire === LEN) out.bytesValue = Buffer.from(m.bytes()).toString('base64');
    else m.skip(wire);
  }
  return out;
}

function keyValue(m: Msg): Plain {
  const out: Plain = { key: '' };
  for (const { field, wire } of m.fields()) {
    if (field === 1 && wire === LEN) out.key = m.string();
    else if (field === 2 && wire === LEN) out.value = anyValue(new Msg(m.bytes()));
    else m.skip(wire);
  }
  return out;
}

/** NumberDataPoint: attributes 7, start 2, time 3 (fixed64), as_double 4, as_int 6 (sfixed64), flags 8. */
function numberPoint(m: Msg): Plain {
  const attributes: Plain[] = [];
  const out: Plain = { attributes };
  for (const { field, wire } of m.fields()) {
    if (field === 7 && wire === LEN) attributes.push(keyValue(new Msg(m.bytes())));
    else if (field === 2 && wire === I64) out.startTimeUnixNano = m.fixed64().toString();
    else if (field === 3 && wire === I64) out.timeUnixNano = m.fixed64().toString();
    else if (field === 4 && wire === I64) out.asDouble = m.double();
    else if (field === 6 && wire === I64) out.asInt = m.sfixed64().toString();
    else if (field === 8 && wire === VARINT) out.flags = m.varint();
    else m.skip(wire);
  }
  return out;
}

/** HistogramDataPoint: attributes 9, start 2, time 3, count 4, sum 5, bucket_counts 6, explicit_bounds 7, flags 10. */
function histogramPoint(m: Msg): Plain {
  const attributes: Plain[] = [];
  const bucketCounts: number[] = [];
  const explicitBounds: number[] = [];
  const out: Plain = { attributes, bucketCounts, explicitBounds };
  for (const { field, wire } of m.fields()) {
    if (field === 9 && wire === LEN) attributes.push(keyValue(new Msg(m.bytes())));
    else if (field === 2 && wire === I64) out.startTimeUnixNano = m.fixed64().toString();
    else if (field === 3 && wire === I64) out.timeUnixNano = m.fixed64().toString();
    else if (field === 4 && wire === I64) out.count = m.fixed64().toString();
    else if (field === 5 && wire === I64) out.sum = m.double();
    else if (field === 6) m.repeated64(wire, (v, at) => Number(v.getBigUint64(at, true)), bucketCounts);
    else if (field === 7) m.repeated64(wire, (v, at) => v.getFloat64(at, true), explicitBounds);
    else if (field === 10 && wire === VARINT) out.flags = m.varint();
    else m.skip(wire);
  }
  return out;
}

/** Gauge / Sum / Histogram bodies: data_points 1, aggregation_temporality 2, is_monotonic 3. */
function metricData(m: Msg, point: ((m: Msg) => Plain) | null): Plain {
  const dataPoints: Plain[] = [];
  const out: Plain = { dataPoints };
  for (const { field, wire } of m.fields()) {
    if (field === 1 && wire === LEN) {
      const b = m.bytes();
      // Types the intake does not store are only counted (to report them as rejected).
      dataPoints.push(point ? point(new Msg(b)) : {});
    } else if (field === 2 && wire === VARINT) out.aggregationTemporality = m.varint();
    else if (field === 3 && wire === VARINT) out.isMonotonic = m.varint() !== 0;
    else m.skip(wire);
  }
  return out;
}

/** Metric: name 1, description 2, unit 3, gauge 5, sum 7, histogram 9, exponential_histogram 10, summary 11. */
function metric(m: Msg): Plain {
  const out: Plain = {};
  for (const { field, wire } of m.fields()) {
    if (field === 1 && wire === LEN) out.name = m.string();
    else if (field === 2 && wire === LEN) out.description = m.string();
    else if (field === 3 && wire === LEN) out.unit = m.string();
    else if (field === 5 && wire === LEN) out.gauge = metricData(new Msg(m.bytes()), numberPoint);
    else if (field === 7 && wire === LEN) out.sum = metricData(new Msg(m.bytes()), numberPoint);
    else if (field === 9 && wire === LEN) out.histogram = metricData(new Msg(m.bytes()), histogramPoint);
    else if (field === 10 && wire === LEN) out.exponentialHistogram = metricData(new Msg(m.bytes()), null);
    else if (field === 11 && wire === LEN) out.summary = metricData(new Msg(m.bytes()), null);
    else m.skip(wire);
  }
  return out;
}

function scopeMetrics(m: Msg): Plain {
  const metrics: Plain[] = [];
  for (const { field, wire } of m.fields()) {
    if (field === 2 && wire === LEN) metrics.push(metric(new Msg(m.bytes())));
    else m.skip(wire);
  }
  return { metrics };
}

function resourceMetrics(m: Msg): Plain {
  const attributes: Plain[] = [];
  const scopes: Plain[] = [];
  for (const { field, wire } of m.fields()) {
    if (field === 1 && wire === LEN) {
      const res = new Msg(m.bytes());
      for (const f of res.fields()) if (f.field === 1 && f.wire === LEN) attributes.push(keyValue(new Msg(res.bytes())));
      else res.skip(f.wire);
    } else if (field === 2 && wire === LEN) scopes.push(scopeMetrics(new Msg(m.bytes())));
    else m.skip(wire);
  }
  return { resource: { attributes }, scopeMetrics: scopes };
}

/** ExportMetricsServiceRequest: resource_metrics 1. Throws ProtobufDecodeError on malformed bytes. */
export function decodeExportMetricsRequest(buf: Uint8Array): { resourceMetrics: Plain[] } {
  try {
    const m = new Msg(buf);
    const out: Plain[] = [];
    for (const { field, wire } of m.fields()) {
      if (field === 1 && wire === LEN) out.push(resourceMetrics(new Msg(m.bytes())));
      else m.skip(wire);
    }
    return { resourceMetrics: out };
  } catch (e) {
    if (e instanceof ProtobufDecodeError) throw e;
    throw new ProtobufDecodeError(`not a valid ExportMetricsServiceRequest: ${(e as Error).message}`);
  }
}

/** ExportMetricsServiceResponse { partial_success 1 { rejected_data_points 1, error_message 2 } }. */
export function encodeExportMetricsResponse(partial?: { rejectedDataPoints: number; errorMessage: string }): Uint8Array {
  const w = new ProtobufWriter(64);
  if (partial) {
    w.writeTag(1, LEN);
    const at = w.startLengthDelimited();
    const start = w.pos;
    w.writeTag(1, VARINT);
    w.writeVarint(partial.rejectedDataPoints);
    w.writeTag(2, LEN);
    w.writeString(partial.errorMessage);
    w.finishLengthDelimited(at, w.pos - start);
  }
  return w.finish();
}

/** google.rpc.Status { code 1, message 2 }: the body OTLP asks for with an error status. */
export function encodeStatus(code: number, message: string): Uint8Array {
  const w = new ProtobufWriter(64 + message.length * 3);
  w.writeTag(1, VARINT);
  w.writeVarint(code);
  w.writeTag(2, LEN);
  w.writeString(message);
  return w.finish();
}
