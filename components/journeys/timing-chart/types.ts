import type { ChartData } from './chart-data';

export interface TimingChartProps {
  data: ChartData;
  /** Drawing width in pixels, measured by the host. */
  width: number;
  height: number;
}
