// Native: Skia is part of the app binary, so a chart renders directly.
import * as plots from './plots';
import type { PlotComponent, PlotName } from './lazy-plot.types';

export function lazyPlot<K extends PlotName>(name: K): PlotComponent<K> {
  return plots[name] as unknown as PlotComponent<K>;
}
