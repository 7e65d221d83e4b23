// A query answer turned into what the chart draws: one row per instant, one line per group,
// and the instants where a ratio had no traffic (drawn as a gap and a hollow mark, never as 0).
import type { QueryGroup, QueryResult } from '../../../shared/schemas/signals';

export interface ChartRow extends Record<string, number | null> {
  t: number;
}

export interface ChartLine {
  /** Row key of this line ("g0", "g1", …). */
  key: string;
  label: string;
  /** Which colour and dash pattern it gets. */
  style: number;
}

export interface ChartModel {
  rows: ChartRow[];
  lines: ChartLine[];
  /** Groups beyond the drawable number: still listed in the latest values. */
  hiddenGroups: number;
  noTraffic: number[];
  /** `${line key}@${t}` for each point that had no traffic. */
  noTrafficPoints: Set<string>;
  domain: [number, number];
  yDomain: [number, number];
  /** Raw samples of several series do not share instants: join their points instead of gapping. */
  connectGaps: boolean;
  /** No value at all in the range. */
  empty: boolean;
}

/** Six colours × three dash patterns: past this many lines, they could no longer be told apart. */
export const MAX_LINES = 18;

export const lineKey = (index: number) => `g${index}`;

/** "route=/pay, status=500"; a group without labels is everything the query matched. */
export function groupLabel(labels: Record<string, string>): string {
  const parts = Object.entries(labels).map(([k, v]) => `${k}=${v === '' ? '(none)' : v}`);
  return parts.length ? parts.join(', ') : 'all series';
}

export function buildChartModel(result: QueryResult): ChartModel {
  const drawn = result.groups.slice(0, MAX_LINES);
  const lines: ChartLine[] = drawn.map((g, i) => ({ key: lineKey(i), label: groupLabel(g.labels), style: i }));
  const byTime = new Map<number, ChartRow>();
  const noTraffic = new Set<number>();
  const noTrafficPoints = new Set<string>();
  let min = Infinity;
  let max = -Infinity;
  drawn.forEach((g: QueryGroup, i) => {
    for (const p of g.points) {
      let row = byTime.get(p.t);
      if (!row) {
        row = { t: p.t };
        for (const l of lines) row[l.key] = null;
        byTime.set(p.t, row);
      }
      row[lineKey(i)] = p.v;
      if (p.noTraffic) {
        noTraffic.add(p.t);
        noTrafficPoints.add(`${lineKey(i)}@${p.t}`);
      }
      if (p.v !== null && Number.isFinite(p.v)) {
        min = Math.min(min, p.v);
        max = Math.max(max, p.v);
      }
    }
  });
  const rows = [...byTime.values()].sort((a, b) => a.t - b.t);
  const empty = min === Infinity;
  return {
    rows,
    lines,
    hiddenGroups: Math.max(0, result.groups.length - drawn.length),
    noTraffic: [...noTraffic].sort((a, b) => a - b),
    noTrafficPoints,
    domain: [result.from, result.to],
    yDomain: empty ? [0, 1] : valueDomain(min, max),
    connectGaps: result.fn === 'raw',
    empty,
  };
}

/** From zero for values that are never negative (most are), with a tenth of headroom. */
function valueDomain(min: number, max: number): [number, number] {
  if (min >= 0) return [0, max > 0 ? max * 1.1 : 1];
  if (max === min) return [min - 1, max + 1];
  const pad = (max - min) * 0.1;
  return [min - pad, max + pad];
}

/** The row nearest in time (rows sorted by t). */
export function nearestRow(rows: readonly ChartRow[], t: number): number {
  if (rows.length === 0) return -1;
  let lo = 0;
  let hi = rows.length - 1;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (rows[mid]!.t < t) lo = mid + 1;
    else hi = mid;
  }
  if (lo > 0 && Math.abs(rows[lo - 1]!.t - t) <= Math.abs(rows[lo]!.t - t)) return lo - 1;
  return lo;
}
