// OTLP/HTTP protobuf with protobufjs: ExportMetricsServiceRequest bytes → the same plain shape the
// JSON encoding parses to (lowerCamelCase keys, enums as integers, 64-bit integers as decimal
// strings, bytes as base64), so one normaliser (otlp-normalize.ts) maps both encodings; and
// ExportMetricsServiceResponse / google.rpc.Status → bytes. The schema is otlp-metrics.proto.ts.
import protobuf from 'protobufjs';
import { OTLP_PROTO_FILES } from './otlp-metrics.proto';

export class ProtobufDecodeError extends Error {}

function loadRoot(): protobuf.Root {
  const root = new protobuf.Root();
  for (const source of OTLP_PROTO_FILES) protobuf.parse(source, root);
  root.resolveAll();
  return root;
}

/** Parsed once per process; protobufjs generates each type's decoder on first use. */
export const otlpRoot = loadRoot();
export const ExportMetricsServiceRequest = otlpRoot.lookupType('opentelemetry.proto.collector.metrics.v1.ExportMetricsServiceRequest');
export const ExportMetricsServiceResponse = otlpRoot.lookupType('opentelemetry.proto.collector.metrics.v1.ExportMetricsServiceResponse');
const Status = otlpRoot.lookupType('google.rpc.Status');

// The proto3 JSON mapping (what OTLP/JSON is): int64/fixed64 as decimal strings, bytes as base64;
// fields left at their default are absent, as an OTLP/JSON sender usually leaves them out.
const AS_JSON: protobuf.IConversionOptions = { longs: String, bytes: String, defaults: false };

/** ExportMetricsServiceRequest → plain object. Throws ProtobufDecodeError on malformed bytes. */
export function decodeExportMetricsRequest(buf: Uint8Array): Record<string, unknown> {
  let message: protobuf.Message;
  try {
    message = ExportMetricsServiceRequest.decode(buf);
  } catch (e) {
    throw new ProtobufDecodeError(`The body is not a valid protobuf ExportMetricsServiceRequest: ${(e as Error).message}`);
  }
  return ExportMetricsServiceRequest.toObject(message, AS_JSON);
}

/** ExportMetricsServiceResponse, with partial_success only when points were rejected. */
export function encodeExportMetricsResponse(partial?: { rejectedDataPoints: number; errorMessage: string }): Uint8Array {
  const message = ExportMetricsServiceResponse.fromObject(partial ? { partialSuccess: partial } : {});
  return ExportMetricsServiceResponse.encode(message).finish();
}

/** google.rpc.Status { code, message }: the body OTLP asks for with an error status. */
export function encodeStatus(code: number, message: string): Uint8Array {
  return Status.encode(Status.fromObject({ code, message })).finish();
}
