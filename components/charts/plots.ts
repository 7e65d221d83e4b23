// Every Skia chart of the app, in one module. On the web it is only ever loaded through
// lazy-plot.web.tsx, so all charts share one chunk with Skia and victory-native: were each chart
// its own chunk, the web build would move everything they share (Skia, victory-native,
// reanimated) into the chunk every page loads first. Add a new chart here, not a loader of its own.
export { default as TimingChartPlot } from '../journeys/timing-chart/timing-chart-plot';
export { default as SignalChartPlot } from '../signals/chart/signal-chart-plot';
