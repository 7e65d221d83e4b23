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
import { LabelSets } from './otlp-label-sets';
import { attributes, doubleValue, intValue, list, MalformedOtlpError, nanosToMs, obj, rethrowWithin, str } from './otlp-values';

export { MalformedOtlpError } from './otlp-values';

export interface NormalizedRequest {
  points: IngestPoint[];
  /** Data points refused, counted per reason. */
  rejected: Map<string, number>;
  /** Data points deliberately skipped (flagged "no recorded value"). */
  skipped: number;
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
    const labelSets = new LabelSets(instance);
    const pointLabels = (v: unknown, path: string) => labelSets.of(v, path);

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
