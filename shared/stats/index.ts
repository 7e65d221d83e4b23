// Statistical tests and SLO arithmetic shared by the server, worker and client.
export * from './log-factorial';
export * from './normal-distribution';
export * from './wilson-interval';
export * from './binomial-tail';
export * from './fisher-exact';
export * from './mann-whitney';
export * from './satisfaction-index';
export * from './burn-rate';
