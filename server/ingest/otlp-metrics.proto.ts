// The part of the OTLP schema the metrics intake reads and writes, as .proto text for protobufjs.
//
// Sources, written from memory of the published definitions (field numbers and types as in
// opentelemetry-proto 1.x; the wire format is checked by tests/interop/otlp/sdk-export.test.ts with
// the real OpenTelemetry proto exporter, and by tests/unit/ingest/otlp-protobuf.test.ts against
// @opentelemetry/otlp-transformer's independent encoder):
//   - opentelemetry-proto, opentelemetry/proto/collector/metrics/v1/metrics_service.proto
//     (ExportMetricsServiceRequest, ExportMetricsServiceResponse, ExportMetricsPartialSuccess)
//   - opentelemetry-proto, opentelemetry/proto/metrics/v1/metrics.proto
//   - opentelemetry-proto, opentelemetry/proto/common/v1/common.proto
//     (AnyValue, ArrayValue, KeyValueList, KeyValue, InstrumentationScope)
//   - opentelemetry-proto, opentelemetry/proto/resource/v1/resource.proto (Resource)
//   - googleapis, google/rpc/status.proto (Status, the body OTLP/HTTP sends with an error status)
//
// Deliberately left out, because the intake never reads them: exemplars, Metric.metadata,
// Resource.entity_refs, schema_url, the detail fields of exponential histogram and summary points
// (those points are only counted, to report them as rejected) and Status.details. A proto3
// decoder skips fields it does not know, so leaving them out changes nothing on the wire.
// One string per published file, because a .proto file (and protobuf.parse) takes one package
// and the messages keep their published full names (opentelemetry.proto.metrics.v1.Metric, …).
export const OTLP_COMMON_PROTO = `
syntax = "proto3";

package opentelemetry.proto.common.v1;

message AnyValue {
  oneof value {
    string string_value = 1;
    bool bool_value = 2;
    int64 int_value = 3;
    double double_value = 4;
    ArrayValue array_value = 5;
    KeyValueList kvlist_value = 6;
    bytes bytes_value = 7;
  }
}

message ArrayValue {
  repeated AnyValue values = 1;
}

message KeyValueList {
  repeated KeyValue values = 1;
}

message KeyValue {
  string key = 1;
  AnyValue value = 2;
}

message InstrumentationScope {
  string name = 1;
  string version = 2;
  repeated KeyValue attributes = 3;
  uint32 dropped_attributes_count = 4;
}
`;

export const OTLP_RESOURCE_PROTO = `
syntax = "proto3";

package opentelemetry.proto.resource.v1;

message Resource {
  repeated opentelemetry.proto.common.v1.KeyValue attributes = 1;
  uint32 dropped_attributes_count = 2;
}
`;

export const OTLP_METRICS_DATA_PROTO = `
syntax = "proto3";

package opentelemetry.proto.metrics.v1;

message ResourceMetrics {
  opentelemetry.proto.resource.v1.Resource resource = 1;
  repeated ScopeMetrics scope_metrics = 2;
}

message ScopeMetrics {
  opentelemetry.proto.common.v1.InstrumentationScope scope = 1;
  repeated Metric metrics = 2;
}

message Metric {
  string name = 1;
  string description = 2;
  string unit = 3;
  oneof data {
    Gauge gauge = 5;
    Sum sum = 7;
    Histogram histogram = 9;
    ExponentialHistogram exponential_histogram = 10;
    Summary summary = 11;
  }
}

message Gauge {
  repeated NumberDataPoint data_points = 1;
}

message Sum {
  repeated NumberDataPoint data_points = 1;
  AggregationTemporality aggregation_temporality = 2;
  bool is_monotonic = 3;
}

message Histogram {
  repeated HistogramDataPoint data_points = 1;
  AggregationTemporality aggregation_temporality = 2;
}

message ExponentialHistogram {
  repeated ExponentialHistogramDataPoint data_points = 1;
  AggregationTemporality aggregation_temporality = 2;
}

message Summary {
  repeated SummaryDataPoint data_points = 1;
}

enum AggregationTemporality {
  AGGREGATION_TEMPORALITY_UNSPECIFIED = 0;
  AGGREGATION_TEMPORALITY_DELTA = 1;
  AGGREGATION_TEMPORALITY_CUMULATIVE = 2;
}

message NumberDataPoint {
  repeated opentelemetry.proto.common.v1.KeyValue attributes = 7;
  fixed64 start_time_unix_nano = 2;
  fixed64 time_unix_nano = 3;
  oneof value {
    double as_double = 4;
    sfixed64 as_int = 6;
  }
  uint32 flags = 8;
}

message HistogramDataPoint {
  repeated opentelemetry.proto.common.v1.KeyValue attributes = 9;
  fixed64 start_time_unix_nano = 2;
  fixed64 time_unix_nano = 3;
  fixed64 count = 4;
  optional double sum = 5;
  repeated fixed64 bucket_counts = 6;
  repeated double explicit_bounds = 7;
  uint32 flags = 10;
  optional double min = 11;
  optional double max = 12;
}

message ExponentialHistogramDataPoint {
  repeated opentelemetry.proto.common.v1.KeyValue attributes = 1;
  fixed64 start_time_unix_nano = 2;
  fixed64 time_unix_nano = 3;
  fixed64 count = 4;
}

message SummaryDataPoint {
  repeated opentelemetry.proto.common.v1.KeyValue attributes = 7;
  fixed64 start_time_unix_nano = 2;
  fixed64 time_unix_nano = 3;
  fixed64 count = 4;
  double sum = 5;
}
`;

export const OTLP_METRICS_SERVICE_PROTO = `
syntax = "proto3";

package opentelemetry.proto.collector.metrics.v1;

message ExportMetricsServiceRequest {
  repeated opentelemetry.proto.metrics.v1.ResourceMetrics resource_metrics = 1;
}

message ExportMetricsServiceResponse {
  ExportMetricsPartialSuccess partial_success = 1;
}

message ExportMetricsPartialSuccess {
  int64 rejected_data_points = 1;
  string error_message = 2;
}
`;

export const GOOGLE_RPC_STATUS_PROTO = `
syntax = "proto3";

package google.rpc;

message Status {
  int32 code = 1;
  string message = 2;
}
`;

/** Every file above, in dependency order (protobuf.parse fills one Root from each in turn). */
export const OTLP_PROTO_FILES = [OTLP_COMMON_PROTO, OTLP_RESOURCE_PROTO, OTLP_METRICS_DATA_PROTO, OTLP_METRICS_SERVICE_PROTO, GOOGLE_RPC_STATUS_PROTO];
