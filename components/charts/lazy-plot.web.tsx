// Web: charts need CanvasKit. It and the charts load on demand (two chunks: CanvasKit, then every
// chart together) the first time a chart appears, so the first page load stays small; and only
// after mounting, so an export never tries to load them.
import { lazy, Suspense, useEffect, useState, type ComponentProps, type ComponentType } from 'react';
import { Loading } from '../ui/loading';
import type { PlotComponent, PlotName, Plots } from './lazy-plot.types';

async function loadPlots(): Promise<Plots> {
  const { loadCanvasKit } = await import('./canvas-kit');
  await loadCanvasKit();
  return import('./plots');
}

export function lazyPlot<K extends PlotName>(name: K): PlotComponent<K> {
  // Typed loosely inside; the returned component carries the chart's own props.
  const Plot = lazy(async () => ({ default: (await loadPlots())[name] as unknown as ComponentType<object> }));
  function MountedPlot(props: ComponentProps<Plots[K]>) {
    const [mounted, setMounted] = useState(false);
    useEffect(() => setMounted(true), []);
    const fallback = <Loading label="Loading the chart…" />;
    if (!mounted) return fallback;
    return (
      <Suspense fallback={fallback}>
        <Plot {...(props as object)} />
      </Suspense>
    );
  }
  return MountedPlot as PlotComponent<K>;
}
