import type { Verdict } from '../../../shared/journey/run-result';
import type { TimingPoint } from '../../../hooks/queries/journey-views';

/** One run: its slot time and each step's total time (missing where the step did not run). */
export interface ChartRow extends Record<string, number | undefined> {
  t: number;
}

export interface ChartSeries {
  /** The row key of this step ("s0", "s1", …). */
  key: string;
  index: number;
  name: string;
}

export interface ChartMarker {
  runId: number;
  t: number;
  /** Fail markers sit on the last step that ran; void runs have no timing and sit on the axis. */
  y: number | null;
  verdict: Verdict;
}

export interface ChartData {
  rows: ChartRow[];
  series: ChartSeries[];
  markers: ChartMarker[];
  counts: Record<Verdict, number>;
  firstAt: number | null;
  lastAt: number | null;
}

export const stepKey = (index: number) => `s${index}`;

/** Turns the timings endpoint's rows (one per run and step) into one chart row per run. */
export function buildChartData(points: TimingPoint[], vantage?: string): ChartData {
  const byRun = new Map<number, { t: number; verdict: Verdict; steps: Map<number, number> }>();
  const names = new Map<number, string>();
  for (const p of points) {
    if (vantage && p.vantage !== vantage) continue;
    let run = byRun.get(p.runId);
    if (!run) {
      run = { t: Date.parse(p.slotAt), verdict: p.verdict, steps: new Map() };
      byRun.set(p.runId, run);
    }
    if (p.step !== null && p.totalMs !== null) {
      run.steps.set(p.step, p.totalMs);
      // The newest name wins: a step renamed in a later version shows its current name.
      names.set(p.step, p.stepName ?? `Step ${p.step + 1}`);
    }
  }
  const series: ChartSeries[] = [...names.entries()].sort((a, b) => a[0] - b[0]).map(([index, name]) => ({ key: stepKey(index), index, name }));
  const runs = [...byRun.entries()].sort((a, b) => a[1].t - b[1].t);
  const counts: Record<Verdict, number> = { pass: 0, fail: 0, void: 0 };
  const rows: ChartRow[] = [];
  const markers: ChartMarker[] = [];
  for (const [runId, run] of runs) {
    counts[run.verdict]++;
    const row: ChartRow = { t: run.t };
    for (const s of series) row[s.key] = run.steps.get(s.index);
    rows.push(row);
    if (run.verdict !== 'pass') {
      const ran = [...run.steps.keys()].sort((a, b) => a - b);
      const last = ran.length ? run.steps.get(ran[ran.length - 1]!)! : null;
      markers.push({ runId, t: run.t, y: run.verdict === 'fail' ? last : null, verdict: run.verdict });
    }
  }
  return { rows, series, markers, counts, firstAt: runs[0]?.[1].t ?? null, lastAt: runs[runs.length - 1]?.[1].t ?? null };
}
