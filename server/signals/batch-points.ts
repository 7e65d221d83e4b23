// The plain JSON batch (POST /api/signals/samples) and other intakes' rows → IngestPoint.
import type { BatchPoint } from '../../shared/schemas/signals';
import type { IngestPoint } from './ingest-service';
import { canonicalLabels } from './labels';

export function batchPointToIngest(p: BatchPoint, index: number): IngestPoint {
  const { labels, key } = canonicalLabels(p.labels);
  const base = { index, service: p.service, signal: p.signal, kind: p.kind, unit: p.unit ?? '', description: '', labels, labelsKey: key, t: p.t, delta: false };
  if (p.kind === 'histogram') {
    const counts = p.counts!;
    const count = counts.reduce((a, b) => a + b, 0);
    return { ...base, value: count, hist: { bounds: p.bounds!, counts, sum: p.sum ?? null, count } };
  }
  return { ...base, value: p.value! };
}
