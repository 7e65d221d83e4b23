// Hand-built OTLP/JSON requests (OpenTelemetry Protocol specification, JSON encoding: lowerCamelCase
// keys, enums as integers, 64-bit integers as decimal strings) for intake tests that need exact
// control over every field. The SDK-driven tests live in tests/interop/otlp/.
import { addPerson, type TestApp } from '../../helpers/app';
import { tokensService } from '../../../server/services/tokens';
import type { TokenScope } from '../../../shared/roles';

export const CUMULATIVE = 2;
export const DELTA = 1;

export const nanos = (ms: number) => `${BigInt(Math.round(ms * 1000)) * 1000n}`;

export function attrs(labels: Record<string, string | number | boolean>) {
  return Object.entries(labels).map(([key, v]) => ({
    key,
    value: typeof v === 'string' ? { stringValue: v } : typeof v === 'boolean' ? { boolValue: v } : { intValue: String(v) },
  }));
}

export interface NumberPointSpec {
  t: number;
  value: number | string;
  labels?: Record<string, string>;
  int?: boolean;
}

export function numberPoint(p: NumberPointSpec) {
  return {
    attributes: attrs(p.labels ?? {}),
    startTimeUnixNano: nanos(p.t - 60_000),
    timeUnixNano: nanos(p.t),
    ...(p.int ? { asInt: p.value } : { asDouble: p.value }),
  };
}

export function sumMetric(name: string, points: NumberPointSpec[], opts: { monotonic?: boolean; temporality?: number; unit?: string } = {}) {
  return {
    name,
    unit: opts.unit ?? '1',
    sum: { dataPoints: points.map(numberPoint), aggregationTemporality: opts.temporality ?? CUMULATIVE, isMonotonic: opts.monotonic ?? true },
  };
}

export function gaugeMetric(name: string, points: NumberPointSpec[], unit = '1') {
  return { name, unit, gauge: { dataPoints: points.map(numberPoint) } };
}

export interface HistogramPointSpec {
  t: number;
  bounds: number[];
  counts: number[];
  sum?: number | string;
  labels?: Record<string, string>;
  count?: number;
}

export function histogramMetric(name: string, points: HistogramPointSpec[], temporality = CUMULATIVE) {
  return {
    name,
    unit: 'ms',
    histogram: {
      aggregationTemporality: temporality,
      dataPoints: points.map((p) => ({
        attributes: attrs(p.labels ?? {}),
        startTimeUnixNano: nanos(p.t - 60_000),
        timeUnixNano: nanos(p.t),
        count: String(p.count ?? p.counts.reduce((a, b) => a + b, 0)),
        sum: p.sum ?? 0,
        bucketCounts: p.counts.map(String),
        explicitBounds: p.bounds,
      })),
    },
  };
}

export function exportRequest(service: string, metrics: unknown[], resource: Record<string, string> = {}) {
  return {
    resourceMetrics: [
      {
        resource: { attributes: attrs({ 'service.name': service, ...resource }) },
        scopeMetrics: [{ scope: { name: 'parallax-tests', version: '1' }, metrics }],
      },
    ],
  };
}

export async function makeToken(t: TestApp, scopes: TokenScope[], name = `token-${scopes.join('-')}`): Promise<string> {
  const admin = await addPerson(t, 'admin');
  const created = await tokensService(t.db.knex).create({ type: 'user', id: admin.id, email: admin.email, name: admin.name, role: 'admin' }, { name, scopes });
  return created.secret;
}
