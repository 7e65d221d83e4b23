// An OTLP ExportMetricsServiceRequest (JSON, or protobuf decoded to the same shape) → points to
// store, plus the points refused and why. Mapping (issue 4): monotonic sums → counters,
// non-monotonic sums and gauges → gauges, explicit-bucket histograms → histograms; the resource's
// `service.name` → service; data point attributes → labels (plus the resource's
// `service.instance.id`, without which two instances' cumulative counters would land in one
// series and read as endless resets).
//
// Structure that is not OTLP (a list where an object belongs, a time that is not a number) makes
// the whole request malformed (400). Values that are well-formed but unusable — NaN or infinite,
// bucket counts that do not match the bounds — reject only their data point (partial success).
import type { IngestPoint } from '../signals/ingest-service';
import { canonicalLabels, type CanonicalLabels } from '../signals/labels';

export class MalformedOtlpError extends Error {
  constructor(
    public path: string,
    readonly reason: string,
  ) {
    super(`${path}: ${reason}`);
  }
  /** Paths inside data points are relative until an error needs them whole (no strings per point). */
  within(prefix: string): this {
    this.path = this.path ? `${prefix}.${this.path}` : prefix;
    this.message = `${this.path}: ${this.reason}`;
    return this;
  }
}

function rethrowWithin(e: unknown, prefix: string): never {
  throw e instanceof MalformedOtlpError ? e.within(prefix) : e;
}

export interface NormalizedRequest {
  points: IngestPoint[];
  /** Data points refused, counted per reason. */
  rejected: Map<string, number>;
  /** Data points deliberately skipped (flagged "no recorded value"). */
  skipped: number;
}

type Obj = Record<string, unknown>;

const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

function list(v: unknown, path: string): unknown[] {
  if (v === undefined || v === null) return [];
  if (!Array.isArray(v)) throw new MalformedOtlpError(path, 'must be a list');
  return v;
}
function obj(v: unknown, path: string): Obj {
  if (!isObj(v)) throw new MalformedOtlpError(path, 'must be an object');
  return v;
}
function str(v: unknown, path: string): string {
  if (v === undefined || v === null) return '';
  if (typeof v !== 'string') throw new MalformedOtlpError(path, 'must be a string');
  return v;
}

/** fixed64 nanoseconds as a decimal string or a number → ms (fractions keep microseconds). */
function nanosToMs(v: unknown, path: string): number | null {
  if (v === undefined || v === null) return null;
  if (typeof v === 'number') {
    if (!Number.isFinite(v) || v < 0) throw new MalformedOtlpError(path, 'must be a non-negative integer');
    return v === 0 ? null : v / 1e6;
  }
  if (typeof v !== 'string' || !/^\d{1,20}$/.test(v)) throw new MalformedOtlpError(path, 'must be nanoseconds as a decimal string or number');
  if (v.length <= 3) return Number(v) === 0 ? null : Number(v) / 1e6;
  // Whole microseconds stay exact in a double; the nanosecond remainder is below storage precision.
  const us = Number(v.slice(0, -3));
  return us === 0 ? null : us / 1000;
}

/** int64 / uint64 as a decimal string or a number. */
function intValue(v: unknown, path: string): number {
  if (typeof v === 'number') {
    if (!Number.isInteger(v)) throw new MalformedOtlpError(path, 'must be an integer');
    return v;
  }
  if (typeof v === 'string' && /^-?\d{1,20}$/.test(v)) return Number(v);
  throw new MalformedOtlpError(path, 'must be an integer as a decimal string or number');
}

/** double: a number, or proto3 JSON's "NaN" / "Infinity" / "-Infinity" / numeric text. */
function doubleValue(v: unknown, path: string): number {
  if (typeof v === 'number') return v;
  if (typeof v === 'string') {
    if (v === 'NaN') return NaN;
    if (v === 'Infinity') return Infinity;
    if (v === '-Infinity') return -Infinity;
    if (v.trim() !== '' && Number.isFinite(Number(v))) return Number(v);
  }
  throw new MalformedOtlpError(path, 'must be a number');
}

function anyValueText(v: unknown, path: string): string {
  if (!isObj(v)) return '';
  if ('stringValue' in v) return str(v.stringValue, `${path}.stringValue`);
  if ('boolValue' in v) return String(v.boolValue === true || v.boolValue === 'true');
  if ('intValue' in v) return String(intValue(v.intValue, `${path}.intValue`));
  if ('doubleValue' in v) return String(doubleValue(v.doubleValue, `${path}.doubleValue`));
  if ('bytesValue' in v) return str(v.bytesValue, `${path}.bytesValue`);
  if ('arrayValue' in v) {
    const values = list(obj(v.arrayValue, `${path}.arrayValue`).values, `${path}.arrayValue.values`);
    return JSON.stringify(values.map((x, i) => anyValueText(x, `${path}.arrayValue.values.${i}`)));
  }
  if ('kvlistValue' in v) {
    const values = list(obj(v.kvlistValue, `${path}.kvlistValue`).values, `${path}.kvlistValue.values`);
    return JSON.stringify(Object.fromEntries(attributes(values, `${path}.kvlistValue.values`)));
  }
  return '';
}

function attributes(v: unknown, path: string): Array<[string, string]> {
  const out: Array<[string, string]> = [];
  const items = list(v, path);
  for (let i = 0; i < items.length; i++) {
    try {
      const kv = obj(items[i], 'kv');
      const key = str(kv.key, 'key');
      if (key) out.push([key, anyValueText(kv.value, 'value')]);
    } catch (e) {
      // 'kv' marks the item itself.
      if (e instanceof MalformedOtlpError && e.path === 'kv') e.path = '';
      rethrowWithin(e, `${path}.${i}`);
    }
  }
  return out;
}

function temporality(v: unknown, path: string): 'delta' | 'cumulative' | null {
  if (v === 1 || v === 'AGGREGATION_TEMPORALITY_DELTA') return 'delta';
  if (v === 2 || v === 'AGGREGATION_TEMPORALITY_CUMULATIVE') return 'cumulative';
  if (v === undefined || v === null || v === 0 || v === 'AGGREGATION_TEMPORALITY_UNSPECIFIED') return null;
  throw new MalformedOtlpError(path, 'must be 1 (delta) or 2 (cumulative)');
}

const NO_RECORDED_VALUE = 1;

export function normalizeExportRequest(body: unknown): NormalizedRequest {
  const root = obj(body, 'request');
  const points: IngestPoint[] = [];
  const rejected = new Map<string, number>();
  let skipped = 0;
  const reject = (reason: string, n = 1) => rejected.set(reason, (rejected.get(reason) ?? 0) + n);

  const rms = list(root.resourceMetrics, 'resourceMetrics');
  for (let r = 0; r < rms.length; r++) {
    const rp = `resourceMetrics.${r}`;
    const rm = obj(rms[r], rp);
    const resAttrs = new Map(attributes(rm.resource === undefined ? [] : obj(rm.resource, `${rp}.resource`).attributes, `${rp}.resource.attributes`));
    const service = (resAttrs.get('service.name') ?? '').trim().slice(0, 200) || 'unknown_service';
    const instance = resAttrs.get('service.instance.id');
    // Points of one series repeat the same attributes: canonical labels are made once per
    // distinct attribute list (as sent), not once per point.
    const labelCache = new Map<string, CanonicalLabels>();
    const pointLabels = (v: unknown, path: string): CanonicalLabels => {
      const pairs = attributes(v, path);
      let raw = '';
      for (const [k, x] of pairs) raw += `${k}\u0000${x}\u0001`;
      let c = labelCache.get(raw);
      if (!c) {
        const input: Record<string, string> = {};
        if (instance !== undefined) input['service.instance.id'] = instance;
        for (const [k, x] of pairs) input[k] = x;
        c = canonicalLabels(input);
        labelCache.set(raw, c);
      }
      return c;
    };

    const sms = list(rm.scopeMetrics, `${rp}.scopeMetrics`);
    for (let s = 0; s < sms.length; s++) {
      const sp = `${rp}.scopeMetrics.${s}`;
      const metrics = list(obj(sms[s], sp).metrics, `${sp}.metrics`);
      for (let m = 0; m < metrics.length; m++) {
        const mp = `${sp}.metrics.${m}`;
        const metric = obj(metrics[m], mp);
        const name = str(metric.name, `${mp}.name`).trim();
        const unit = str(metric.unit, `${mp}.unit`).slice(0, 64);
        const description = str(metric.description, `${mp}.description`).slice(0, 2000);

        let kind: IngestPoint['kind'];
        let dataKey: 'sum' | 'gauge' | 'histogram';
        let delta = false;
        if (metric.sum !== undefined) {
          dataKey = 'sum';
          const sum = obj(metric.sum, `${mp}.sum`);
          kind = sum.isMonotonic === true || sum.isMonotonic === 'true' ? 'counter' : 'gauge';
          const tmp = temporality(sum.aggregationTemporality, `${mp}.sum.aggregationTemporality`);
          if (tmp === null) {
            reject('sum without aggregation temporality', list(sum.dataPoints, `${mp}.sum.dataPoints`).length);
            continue;
          }
          delta = tmp === 'delta';
        } else if (metric.gauge !== undefined) {
          dataKey = 'gauge';
          kind = 'gauge';
        } else if (metric.histogram !== undefined) {
          dataKey = 'histogram';
          kind = 'histogram';
          const h = obj(metric.histogram, `${mp}.histogram`);
          const tmp = temporality(h.aggregationTemporality, `${mp}.histogram.aggregationTemporality`);
          if (tmp === null) {
            reject('histogram without aggregation temporality', list(h.dataPoints, `${mp}.histogram.dataPoints`).length);
            continue;
          }
          delta = tmp === 'delta';
        } else {
          for (const other of ['exponentialHistogram', 'summary'] as const) {
            if (metric[other] !== undefined) {
              const n = list(obj(metric[other], `${mp}.${other}`).dataPoints, `${mp}.${other}.dataPoints`).length;
              if (n) reject(`${other === 'summary' ? 'summaries' : 'exponential histograms'} are not supported`, n);
            }
          }
          continue;
        }

        const dps = list(obj(metric[dataKey], `${mp}.${dataKey}`).dataPoints, `${mp}.${dataKey}.dataPoints`);
        if (!name) {
          if (dps.length) reject('metric without a name', dps.length);
          continue;
        }
        for (let d = 0; d < dps.length; d++) {
          try {
            const point = obj(dps[d], '');
            const flags = point.flags === undefined ? 0 : intValue(point.flags, 'flags');
            const t = nanosToMs(point.timeUnixNano, 'timeUnixNano');
            const { labels, key } = pointLabels(point.attributes, 'attributes');
            if (flags & NO_RECORDED_VALUE) {
              skipped++;
              continue;
            }
            if (t === null) {
              reject('data point without timeUnixNano');
              continue;
            }
            const index = points.length;

            if (kind === 'histogram') {
              const bounds = list(point.explicitBounds, 'explicitBounds').map((b, i) => doubleValue(b, `explicitBounds.${i}`));
              let counts = list(point.bucketCounts, 'bucketCounts').map((c, i) => intValue(c, `bucketCounts.${i}`));
              const count = point.count === undefined ? counts.reduce((a, b) => a + b, 0) : intValue(point.count, 'count');
              const sum = point.sum === undefined || point.sum === null ? null : doubleValue(point.sum, 'sum');
              // A histogram without buckets carries only count and sum: one +Inf bucket holds it all.
              if (counts.length === 0 && bounds.length === 0) counts = [count];
              if (counts.length !== bounds.length + 1) {
                reject('bucket count mismatch (bucketCounts must have one more entry than explicitBounds)');
                continue;
              }
              if (bounds.some((b, i) => !Number.isFinite(b) || (i > 0 && !(b > bounds[i - 1]!)))) {
                reject('explicitBounds must be finite and strictly increasing');
                continue;
              }
              if (counts.some((c) => c < 0) || count < 0) {
                reject('negative bucket count');
                continue;
              }
              if (counts.reduce((a, b) => a + b, 0) !== count) {
                reject('count differs from the sum of bucketCounts');
                continue;
              }
              if (sum !== null && !Number.isFinite(sum)) {
                reject('NaN or infinite value');
                continue;
              }
              points.push({ index, service, signal: name, kind, unit, description, labels, labelsKey: key, t, delta, value: count, hist: { bounds, counts, sum, count } });
            } else {
              let value: number;
              if (point.asDouble !== undefined && point.asDouble !== null) value = doubleValue(point.asDouble, 'asDouble');
              else if (point.asInt !== undefined && point.asInt !== null) value = intValue(point.asInt, 'asInt');
              else {
                reject('data point without a value');
                continue;
              }
              if (!Number.isFinite(value)) {
                reject('NaN or infinite value');
                continue;
              }
              points.push({ index, service, signal: name, kind, unit, description, labels, labelsKey: key, t, delta, value });
            }
          } catch (e) {
            rethrowWithin(e, `${mp}.${dataKey}.dataPoints.${d}`);
          }
        }
      }
    }
  }
  return { points, rejected, skipped };
}

/** "3 data points rejected: NaN or infinite value (2); bucket count mismatch … (1)". */
export function describeRejections(rejected: Map<string, number>, extra: Array<{ message: string }> = []): { count: number; message: string } {
  const all = new Map(rejected);
  for (const e of extra) all.set(e.message, (all.get(e.message) ?? 0) + 1);
  let count = 0;
  const parts: string[] = [];
  for (const [reason, n] of all) {
    count += n;
    parts.push(`${reason} (${n})`);
  }
  return { count, message: count ? `${count} data point${count === 1 ? '' : 's'} rejected: ${parts.join('; ')}` : '' };
}
