// Signals for rule tests, stored through the real intake (ingest-service), and a few builders.
import type { Knex } from 'knex';
import { batchPointToIngest } from '../../../server/signals/batch-points';
import { ingestService } from '../../../server/signals/ingest-service';
import { tokensService } from '../../../server/services/tokens';
import type { BatchPoint } from '../../../shared/schemas/signals';
import type { TokenScope } from '../../../shared/roles';
import { addPerson, type TestApp } from '../../helpers/app';

/** A whole hour in the past, so aligned steps fall on round instants. */
export const T0 = Date.UTC(2026, 9, 1, 12, 0, 0);
export const STEP = 15_000;

type Point = Omit<BatchPoint, 'labels' | 'unit'> & { labels?: Record<string, string>; unit?: string };

export async function store(db: Knex, points: Point[]): Promise<void> {
  const out = await ingestService(db).write(points.map((p, i) => batchPointToIngest({ labels: {}, ...p } as BatchPoint, i)));
  if (out.rejected.length) throw new Error(`points rejected: ${JSON.stringify(out.rejected.slice(0, 3))}`);
}

/** A gauge (or counter) sampled every 15 s over [from, to], values from `f`. */
export function samples(
  service: string,
  signal: string,
  kind: 'gauge' | 'counter',
  labels: Record<string, string>,
  from: number,
  to: number,
  f: (t: number) => number,
  step = STEP,
): Point[] {
  const out: Point[] = [];
  for (let t = from; t <= to; t += step) out.push({ service, signal, kind, labels, t, value: f(t) });
  return out;
}

export function histogramPoints(service: string, signal: string, labels: Record<string, string>, bounds: number[], from: number, to: number, counts: (t: number) => number[]): Point[] {
  const out: Point[] = [];
  for (let t = from; t <= to; t += STEP) out.push({ service, signal, kind: 'histogram', labels, t, bounds, counts: counts(t) });
  return out;
}

export async function makeToken(t: TestApp, scopes: TokenScope[], name = `token-${scopes.join('-')}-${Math.random().toString(16).slice(2, 8)}`): Promise<string> {
  const admin = await addPerson(t, 'admin');
  const created = await tokensService(t.db.knex).create({ type: 'user', id: admin.id, email: admin.email, name: admin.name, role: 'admin' }, { name, scopes });
  return created.secret;
}

export const NOTE = 'Check the disk usage dashboard, then delete old logs under /var/log/app first.';

export function thresholdDraft(extra: Record<string, unknown> = {}) {
  return {
    name: 'Disk nearly full',
    kind: 'threshold',
    service: 'checkout',
    signal: 'disk_free',
    aggregation: 'last',
    op: '<',
    threshold: 10,
    window: '1m',
    sustain: '1m',
    clear: '30s',
    severity: 'page',
    responderNote: NOTE,
    recipients: ['ops@example.test'],
    ...extra,
  };
}
