import type { MutableRefObject } from 'react';
import type { ChartModel } from './chart-model';

/** Maps between time and the chart's horizontal pixels, as the drawn chart last laid itself out. */
export interface TimeScale {
  toX: (t: number) => number;
  toT: (x: number) => number;
}

export interface SignalChartProps {
  model: ChartModel;
  /** Drawing size in pixels, measured by the host. */
  width: number;
  height: number;
  /** The row the pointer or a tap chose: a cursor line and a dot per line are drawn there. */
  selectedRow: number | null;
  formatX: (t: number) => string;
  formatY: (v: number) => string;
  /** Filled in by the drawn chart on every layout, read by the pointer overlay when it moves. */
  scaleRef: MutableRefObject<TimeScale | null>;
}
