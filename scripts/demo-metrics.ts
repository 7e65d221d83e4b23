// The demo shop's own metrics, sent the way a real service would: the OpenTelemetry JS SDK with
// its OTLP/HTTP (JSON) exporter, to Parallax's /v1/metrics with an ingest token.
import { OTLPMetricExporter } from '@opentelemetry/exporter-metrics-otlp-http';
import { resourceFromAttributes } from '@opentelemetry/resources';
import { MeterProvider, PeriodicExportingMetricReader } from '@opentelemetry/sdk-metrics';
import { LATENCY_BOUNDS_MS } from './demo-target';

export const DEMO_SERVICE = 'quillmoor-shop';

export interface DemoMetrics {
  onRequest(route: string, status: number, ms: number): void;
  flush(): Promise<void>;
  close(): Promise<void>;
}

export function startDemoMetrics(opts: { endpoint: string; token: string; intervalMs?: number; instance?: string }): DemoMetrics {
  const provider = new MeterProvider({
    resource: resourceFromAttributes({ 'service.name': DEMO_SERVICE, 'service.instance.id': opts.instance ?? 'shop-1' }),
    readers: [
      new PeriodicExportingMetricReader({
        exporter: new OTLPMetricExporter({ url: opts.endpoint, headers: { authorization: `Bearer ${opts.token}` } }),
        exportIntervalMillis: opts.intervalMs ?? 15_000,
        exportTimeoutMillis: Math.min(10_000, opts.intervalMs ?? 15_000),
      }),
    ],
  });
  const meter = provider.getMeter('quillmoor-shop');
  const requests = meter.createCounter('http.server.requests', { description: 'Requests answered by the shop', unit: '1' });
  const errors = meter.createCounter('http.server.errors', { description: 'Requests answered with a 5xx status', unit: '1' });
  const duration = meter.createHistogram('http.server.duration', {
    description: 'Time to answer a request',
    unit: 'ms',
    advice: { explicitBucketBoundaries: [...LATENCY_BOUNDS_MS] },
  });
  return {
    onRequest(route, status, ms) {
      const labels = { route, status_class: `${Math.floor(status / 100)}xx` };
      requests.add(1, labels);
      // Errors are counted for every route, including routes that had none yet, so a ratio of
      // errors to requests has both sides from the start.
      errors.add(status >= 500 ? 1 : 0, { route });
      duration.record(ms, { route });
    },
    flush: () => provider.forceFlush(),
    close: () => provider.shutdown(),
  };
}
