import { lazyPlot } from '../../charts/lazy-plot';

/**
 * The signal chart. On the web it loads with every other Skia chart of the app, in one chunk,
 * the first time a chart appears (components/charts/plots.ts).
 */
export const SignalChart = lazyPlot('SignalChartPlot');
