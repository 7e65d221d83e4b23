// Pure metric computations shared by the server (preview, query API), worker (evaluation) and client.
export * from './sample';
export * from './counter-increase';
export * from './window';
export * from './error-ratio';
export * from './aggregation';
export * from './aligned-evaluation';
export * from './histogram';
export * from './histogram-quantile';
export * from './histogram-increase';
export * from './latency-share';
export * from './linear-trend';
export * from './acceleration';
export * from './outliers';
