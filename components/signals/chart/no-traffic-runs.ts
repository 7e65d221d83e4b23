// Only the drawn chart needs this, so it lives apart from chart-model.ts: a module both the chart's
// chunk and the screens' chunk imported would be moved into the first page load.
import type { ChartModel } from './chart-model';

/** Stretches of consecutive rows with no traffic, [first t, last t]: drawn as one hollow bar each. */
export function noTrafficRuns(model: Pick<ChartModel, 'rows' | 'noTraffic'>): Array<[number, number]> {
  const quiet = new Set(model.noTraffic);
  const runs: Array<[number, number]> = [];
  let start: number | null = null;
  model.rows.forEach((row, i) => {
    if (!quiet.has(row.t)) return;
    start ??= row.t;
    const next = model.rows[i + 1];
    if (!next || !quiet.has(next.t)) {
      runs.push([start, row.t]);
      start = null;
    }
  });
  return runs;
}
