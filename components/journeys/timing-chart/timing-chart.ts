import { lazyPlot } from '../../charts/lazy-plot';

/** Step timings over time; on the web it loads on demand with the other charts. */
export const TimingChart = lazyPlot('TimingChartPlot');
