// Delta temporality → cumulative series (see ingest-service.ts for why): each delta point is added
// to the newest stored point of its series inside the intake's transaction.
import type { Knex } from 'knex';
import type { IngestRejection } from '../../shared/schemas/signals';
import type { IngestPoint } from './ingest-service';
import { samplesRepo, type LastHistogram, type LastSample } from './repositories/samples-repo';
import { seriesRepo } from './repositories/series-repo';

export interface Resolved {
  p: IngestPoint;
  seriesId: number;
  signalId: number;
}

/**
 * Turns delta points into cumulative ones (see the top of this file). Series are locked in id
 * order so two requests extending the same series take turns.
 */
export async function accumulateDeltas(
  tx: Knex,
  delta: Resolved[],
  rejected: IngestRejection[],
): Promise<{ rows: Resolved[]; duplicates: number }> {
  if (delta.length === 0) return { rows: [], duplicates: 0 };
  const ids = [...new Set(delta.map((d) => d.seriesId))].sort((a, b) => a - b);
  await seriesRepo.lockSeries(tx, ids);
  const histIds = [...new Set(delta.filter((d) => d.p.hist).map((d) => d.seriesId))];
  const plainIds = [...new Set(delta.filter((d) => !d.p.hist).map((d) => d.seriesId))];
  const lastPlain = await samplesRepo.lastSamples(tx, plainIds);
  const lastHist = await samplesRepo.lastHistograms(tx, histIds);

  const bySeries = new Map<number, Resolved[]>();
  for (const d of delta) {
    const list = bySeries.get(d.seriesId);
    if (list) list.push(d);
    else bySeries.set(d.seriesId, [d]);
  }
  const rows: Resolved[] = [];
  const late: Resolved[] = [];
  let duplicates = 0;
  for (const [seriesId, list] of bySeries) {
    list.sort((a, b) => a.p.t - b.p.t);
    let plain: LastSample | undefined = lastPlain.get(seriesId);
    let hist: LastHistogram | undefined = lastHist.get(seriesId);
    let newestInBatch = -Infinity;
    for (const d of list) {
      const p = d.p;
      if (p.t === newestInBatch) {
        duplicates++;
        continue;
      }
      if (p.hist) {
        if (hist && p.t <= hist.t) {
          late.push(d);
          continue;
        }
        const same = hist && hist.bounds.length === p.hist.bounds.length && hist.bounds.every((b, i) => b === p.hist!.bounds[i]);
        const counts = same ? p.hist.counts.map((c, i) => c + hist!.counts[i]!) : [...p.hist.counts];
        const sum = same ? (p.hist.sum === null || hist!.sum === null ? null : p.hist.sum + hist!.sum) : p.hist.sum;
        const count = same ? p.hist.count + hist!.count : p.hist.count;
        hist = { seriesId, t: p.t, bounds: p.hist.bounds, counts, sum, count };
        rows.push({ seriesId, signalId: d.signalId, p: { ...p, hist: { bounds: p.hist.bounds, counts, sum, count } } });
      } else {
        if (plain && p.t <= plain.t) {
          late.push(d);
          continue;
        }
        const value = (plain?.value ?? 0) + p.value;
        plain = { seriesId, t: p.t, value };
        rows.push({ seriesId, signalId: d.signalId, p: { ...p, value } });
      }
      newestInBatch = p.t;
    }
  }
  if (late.length) {
    const plainLate = late.filter((d) => !d.p.hist);
    const histLate = late.filter((d) => d.p.hist);
    const seen = new Set([
      ...(await samplesRepo.existingTimes(tx, 'samples', plainLate.map((d) => d.seriesId), plainLate.map((d) => d.p.t))),
      ...(await samplesRepo.existingTimes(tx, 'histogram_points', histLate.map((d) => d.seriesId), histLate.map((d) => d.p.t))),
    ]);
    for (const d of late) {
      if (seen.has(`${d.seriesId}:${d.p.t}`)) duplicates++;
      else
        rejected.push({
          index: d.p.index,
          field: 't',
          message: `delta point of ${d.p.signal} is older than the newest stored point of its series (delta points must arrive in time order)`,
        });
    }
  }
  return { rows, duplicates };
}
