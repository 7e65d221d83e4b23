import type { ComponentProps, ComponentType } from 'react';

export type Plots = typeof import('./plots');
export type PlotName = keyof Plots;
export type PlotComponent<K extends PlotName> = ComponentType<ComponentProps<Plots[K]>>;
