// How long each kind of data counts as fresh, in one place.
export const STALE_TIMES = {
  session: 5 * 60_000,
  health: 10_000,
  workers: 5_000,
  users: 30_000,
  tokens: 30_000,
} as const;

// How often live data on screen refreshes itself.
export const REFETCH_INTERVALS = {
  health: 15_000,
  workers: 10_000,
} as const;
