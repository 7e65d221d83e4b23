// Storing points from every intake (OTLP, JSON batch, CSV, collection targets): series found or
// created in bulk, daily partitions made before the write, one transaction per call, nothing
// reported as stored before it is committed.
//
// Delta temporality: a delta point says how much a counter (or histogram bucket) grew since the
// previous point, but queries work on cumulative series (increase and rate handle resets). So a
// delta point is added to the newest stored point of its series and stored as the cumulative
// total from the first delta point on; the series then reads like a counter that started at the
// first delta. Delta points must arrive in time order per series: one at or before the newest
// stored point is a duplicate when a point at that instant exists (a retried export) and is
// rejected otherwise, because adding it would rewrite every later total.
import type { Knex } from 'knex';
import { EARLIEST_SAMPLE_MS, FUTURE_SLACK_MS, type IngestRejection, type SignalKind } from '../../shared/schemas/signals';
import { asUnavailable } from './db-unavailable';
import { labelsHash } from './labels';
import { dayOf, partitionsRepo, type PartitionedTable } from './repositories/partitions-repo';
import { accumulateDeltas, type Resolved } from './delta-accumulation';
import { samplesRepo, type HistogramRows, type SampleRows } from './repositories/samples-repo';
import { seriesRepo, type WantedSeries, type WantedSignal } from './repositories/series-repo';

export interface HistogramValue {
  bounds: number[];
  counts: number[];
  sum: number | null;
  count: number;
}

export interface IngestPoint {
  /** Position in the caller's input, for error reports. */
  index: number;
  service: string;
  signal: string;
  kind: SignalKind;
  unit: string;
  description: string;
  /** Canonical labels and their key (see labels.ts). */
  labels: Record<string, string>;
  labelsKey: string;
  /** ms since the epoch; fractions keep microseconds. */
  t: number;
  /** Counter or gauge value (ignored for histograms). */
  value: number;
  hist?: HistogramValue;
  delta: boolean;
}


export interface IngestOutcome {
  accepted: number;
  duplicates: number;
  rejected: IngestRejection[];
}

interface CachedSeries {
  seriesId: number;
  signalId: number;
  kind: SignalKind;
}
interface Caches {
  /** service + signal → labels key → series. Two levels, so a point is found without building a key string. */
  series: Map<string, Map<string, CachedSeries>>;
  seriesCount: number;
  /** Newest time written to last_sample_at, per series and per signal (see touch()). */
  touched: Map<number, number>;
  touchedSignals: Map<number, number>;
  days: Record<PartitionedTable, Set<number>>;
}

// Shared by every intake on the same database handle; ids of committed rows never change.
const cachesByDb = new WeakMap<Knex, Caches>();
const CACHE_LIMIT = 500_000;
/**
 * last_sample_at of series and signals is for display ("last seen"), so a row is rewritten at
 * most once per minute of sample time per process: at 10 000 points a request, rewriting a
 * thousand series rows every time would cost as much as storing the points. The first sample a
 * process sees of a series or signal is always written.
 */
const TOUCH_EVERY_MS = 60_000;

function cachesFor(db: Knex): Caches {
  let c = cachesByDb.get(db);
  if (!c) {
    c = { series: new Map(), seriesCount: 0, touched: new Map(), touchedSignals: new Map(), days: { samples: new Set(), histogram_points: new Set() } };
    cachesByDb.set(db, c);
  }
  return c;
}

const signalKey = (p: { service: string; signal: string }) => `${p.service}\u0001${p.signal}`;

const NO_PARTITION = /no partition of relation/i;

export function ingestService(db: Knex, opts: { now?: () => number } = {}) {
  const now = opts.now ?? Date.now;
  const caches = cachesFor(db);

  async function ensurePartitions(points: IngestPoint[]): Promise<void> {
    for (const table of ['samples', 'histogram_points'] as const) {
      const known = caches.days[table];
      const wanted = new Set<number>();
      for (const p of points) {
        if ((table === 'histogram_points') !== (p.kind === 'histogram')) continue;
        const d = dayOf(p.t);
        if (!known.has(d)) wanted.add(d);
      }
      if (wanted.size === 0) continue;
      await partitionsRepo.ensureDays(db, table, [...wanted]);
      for (const d of wanted) known.add(d);
    }
  }

  /** Finds or creates the series of every point; points of a signal stored with another kind are rejected. */
  async function resolveSeries(
    tx: Knex,
    points: IngestPoint[],
    rejected: IngestRejection[],
    fresh: Array<[IngestPoint, CachedSeries]>,
  ): Promise<Resolved[]> {
    const out: Resolved[] = [];
    const missing: IngestPoint[] = [];
    // Points come in runs of one signal (an OTLP metric, a CSV's rows): the signal's map is looked
    // up once per run, and a series by its labels key, a string the points of a series share.
    let service: string | undefined;
    let signal: string | undefined;
    let bySignal: Map<string, CachedSeries> | undefined;
    for (const p of points) {
      if (p.signal !== signal || p.service !== service) {
        service = p.service;
        signal = p.signal;
        bySignal = caches.series.get(signalKey(p));
      }
      const hit = bySignal?.get(p.labelsKey);
      if (!hit) missing.push(p);
      else if (hit.kind !== p.kind) rejected.push(kindMismatch(p, hit.kind));
      else out.push({ p, seriesId: hit.seriesId, signalId: hit.signalId });
    }
    if (missing.length === 0) return out;

    const wantedSignals = new Map<string, WantedSignal>();
    for (const p of missing) {
      const k = signalKey(p);
      if (!wantedSignals.has(k)) wantedSignals.set(k, { service: p.service, name: p.signal, kind: p.kind, unit: p.unit, description: p.description });
    }
    const serviceIds = await seriesRepo.ensureServices(tx, [...new Set(missing.map((p) => p.service))]);
    const signals = await seriesRepo.ensureSignals(tx, serviceIds, [...wantedSignals.values()]);
    const signalByKey = new Map(signals.map((s) => [`${s.service}\u0001${s.name}`, s]));

    const wantedSeries = new Map<string, WantedSeries>();
    const ok: IngestPoint[] = [];
    for (const p of missing) {
      const s = signalByKey.get(signalKey(p))!;
      if (s.kind !== p.kind) {
        rejected.push(kindMismatch(p, s.kind));
        continue;
      }
      ok.push(p);
      const hash = labelsHash(p.labelsKey);
      const k = `${s.id}:${hash}`;
      if (!wantedSeries.has(k)) wantedSeries.set(k, { signalId: s.id, labels: p.labels, labelsHash: hash });
    }
    const seriesIds = wantedSeries.size ? await seriesRepo.ensureSeries(tx, [...wantedSeries.values()]) : new Map<string, number>();
    for (const p of ok) {
      const s = signalByKey.get(signalKey(p))!;
      const seriesId = seriesIds.get(`${s.id}:${labelsHash(p.labelsKey)}`)!;
      fresh.push([p, { seriesId, signalId: s.id, kind: s.kind }]);
      out.push({ p, seriesId, signalId: s.id });
    }
    return out;
  }

  async function writeOnce(points: IngestPoint[]) {
    await ensurePartitions(points);
    const rejected: IngestRejection[] = [];
    const fresh: Array<[IngestPoint, CachedSeries]> = [];
    const result = await db.transaction(async (tx) => {
      const resolved = await resolveSeries(tx, points, rejected, fresh);
      const cumulative = resolved.filter((r) => !r.p.delta);
      const delta = resolved.filter((r) => r.p.delta);
      const { rows: deltaRows, duplicates: deltaDuplicates } = await accumulateDeltas(tx, delta, rejected);
      const all = cumulative.concat(deltaRows);

      const samples: SampleRows = { seriesIds: [], times: [], values: [] };
      const hists: HistogramRows = { seriesIds: [], times: [], bounds: [], counts: [], sums: [], totals: [] };
      for (const { p, seriesId } of all) {
        if (p.hist) {
          hists.seriesIds.push(seriesId);
          hists.times.push(p.t);
          hists.bounds.push(p.hist.bounds);
          hists.counts.push(p.hist.counts);
          hists.sums.push(p.hist.sum);
          hists.totals.push(p.hist.count);
        } else {
          samples.seriesIds.push(seriesId);
          samples.times.push(p.t);
          samples.values.push(p.value);
        }
      }
      const inserted = (await samplesRepo.insertSamples(tx, samples)) + (await samplesRepo.insertHistograms(tx, hists));
      return {
        rejected,
        accepted: inserted,
        duplicates: all.length - inserted + deltaDuplicates,
        stored: all,
      };
    });
    // Committed: from here on the ids are real.
    if (caches.seriesCount > CACHE_LIMIT) {
      caches.series.clear();
      caches.seriesCount = 0;
    }
    for (const [p, v] of fresh) {
      const k = signalKey(p);
      let bySignal = caches.series.get(k);
      if (!bySignal) caches.series.set(k, (bySignal = new Map()));
      if (!bySignal.has(p.labelsKey)) caches.seriesCount++;
      bySignal.set(p.labelsKey, v);
    }
    return result;
  }

  async function touch(stored: Resolved[]): Promise<void> {
    const series = new Map<number, number>();
    const signals = new Map<number, number>();
    for (const { p, seriesId, signalId } of stored) {
      if (!(p.t <= (series.get(seriesId) ?? -Infinity))) series.set(seriesId, p.t);
      if (!(p.t <= (signals.get(signalId) ?? -Infinity))) signals.set(signalId, p.t);
    }
    const dueOf = (m: Map<number, number>, seen: Map<number, number>) => [...m].filter(([id, t]) => !(t < (seen.get(id) ?? -Infinity) + TOUCH_EVERY_MS));
    const dueSignals = dueOf(signals, caches.touchedSignals);
    const dueSeries = dueOf(series, caches.touched);
    await seriesRepo.touchLastSample(db, 'signals', dueSignals.map(([id]) => id), dueSignals.map(([, t]) => t));
    await seriesRepo.touchLastSample(db, 'series', dueSeries.map(([id]) => id), dueSeries.map(([, t]) => t));
    if (caches.touched.size > CACHE_LIMIT) caches.touched.clear();
    for (const [id, t] of dueSignals) caches.touchedSignals.set(id, t);
    for (const [id, t] of dueSeries) caches.touched.set(id, t);
  }

  return {
    /**
     * Stores the points in one transaction and resolves only after it committed. Points outside
     * the accepted time range, of a signal stored with another kind, or delta points out of order
     * are rejected and reported; the others are kept. Throws UnavailableError (503) when the
     * database cannot be reached: then nothing was stored.
     */
    async write(input: IngestPoint[]): Promise<IngestOutcome> {
      const rejected: IngestRejection[] = [];
      const latest = now() + FUTURE_SLACK_MS;
      const points = input.filter((p) => {
        if (p.t >= EARLIEST_SAMPLE_MS && p.t <= latest) return true;
        rejected.push({ index: p.index, field: 't', message: `time ${new Date(p.t).toISOString()} lies before 2000 or more than a day ahead` });
        return false;
      });
      if (points.length === 0) return { accepted: 0, duplicates: 0, rejected };
      let result;
      try {
        try {
          result = await writeOnce(points);
        } catch (e) {
          // A partition dropped by retention while this process still believed it existed.
          if (!NO_PARTITION.test((e as Error).message ?? '')) throw e;
          caches.days.samples.clear();
          caches.days.histogram_points.clear();
          result = await writeOnce(points);
        }
      } catch (e) {
        throw asUnavailable(e);
      }
      // Best effort after commit: "last sample" times are for display, never worth failing the write.
      await touch(result.stored).catch(() => {});
      return { accepted: result.accepted, duplicates: result.duplicates, rejected: rejected.concat(result.rejected) };
    },
  };
}

function kindMismatch(p: IngestPoint, stored: SignalKind): IngestRejection {
  return { index: p.index, field: 'kind', message: `signal ${p.signal} of ${p.service} is stored as a ${stored}, not a ${p.kind}` };
}
