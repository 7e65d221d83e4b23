// One collection: fetch a target's JSON with undici, flatten it, store every number as a sample
// of the claimed slot. The slot (not the clock) stamps the samples, so a retried job writes the
// same points again and the unique key keeps them once.
import type { Knex } from 'knex';
import { request, type Dispatcher } from 'undici';
import type { CollectionTargetView } from '../../shared/schemas/signals';
import { collectionTargetsRepo } from '../../server/signals/repositories/collection-targets-repo';
import { ingestService, type IngestPoint } from '../../server/signals/ingest-service';
import { canonicalLabels } from '../../server/signals/labels';
import { assertCollectable } from './address-guard';
import { counterMatcher, flattenNumbers } from './flatten';

export const MAX_DOCUMENT_BYTES = 5 * 1024 * 1024;

export interface CollectOptions {
  timeoutMs?: number;
  dispatcher?: Dispatcher;
  now?: () => Date;
}

export interface CollectOutcome {
  samples: number;
  error: string | null;
}

async function fetchJson(db: Knex, url: string, opts: CollectOptions): Promise<unknown> {
  await assertCollectable(db, url);
  const timeout = opts.timeoutMs ?? 10_000;
  const res = await request(url, {
    method: 'GET',
    headers: { accept: 'application/json', 'user-agent': 'parallax-collector' },
    headersTimeout: timeout,
    bodyTimeout: timeout,
    ...(opts.dispatcher ? { dispatcher: opts.dispatcher } : {}),
  });
  if (res.statusCode < 200 || res.statusCode > 299) {
    await res.body.dump();
    throw new Error(`${url} answered HTTP ${res.statusCode}`);
  }
  const chunks: Buffer[] = [];
  let size = 0;
  for await (const chunk of res.body) {
    size += (chunk as Buffer).length;
    if (size > MAX_DOCUMENT_BYTES) {
      res.body.destroy();
      throw new Error(`${url} sent more than ${MAX_DOCUMENT_BYTES / 1048576} MiB`);
    }
    chunks.push(chunk as Buffer);
  }
  try {
    return JSON.parse(Buffer.concat(chunks).toString('utf8'));
  } catch {
    throw new Error(`${url} did not send JSON`);
  }
}

export function documentToPoints(target: Pick<CollectionTargetView, 'service' | 'counterKeys' | 'labels' | 'prefix'>, doc: unknown, slotMs: number): IngestPoint[] {
  const isCounter = counterMatcher(target.counterKeys);
  const { labels, key } = canonicalLabels(target.labels);
  return flattenNumbers(doc).map(([k, v], index) => ({
    index,
    service: target.service,
    signal: `${target.prefix}${k}`,
    kind: isCounter(k) ? 'counter' : 'gauge',
    unit: '',
    description: '',
    labels,
    labelsKey: key,
    t: slotMs,
    value: v,
    delta: false,
  }));
}

export async function collectTarget(db: Knex, target: CollectionTargetView, slotMs: number, opts: CollectOptions = {}): Promise<CollectOutcome> {
  const now = opts.now ?? (() => new Date());
  let outcome: CollectOutcome;
  try {
    const doc = await fetchJson(db, target.url, opts);
    const points = documentToPoints(target, doc, slotMs);
    const written = points.length ? await ingestService(db).write(points) : { accepted: 0, duplicates: 0, rejected: [] };
    outcome = {
      samples: written.accepted + written.duplicates,
      error: written.rejected.length ? `${written.rejected.length} value(s) refused: ${written.rejected[0]!.message}` : null,
    };
  } catch (e) {
    outcome = { samples: 0, error: (e as Error).message.slice(0, 500) };
  }
  await collectionTargetsRepo.recordRun(db, target.id, { at: now(), error: outcome.error, sampleCount: outcome.samples });
  return outcome;
}
