// How long each kind of data counts as fresh, in one place.
export const STALE_TIMES = {
  session: 5 * 60_000,
  health: 10_000,
  workers: 5_000,
  users: 30_000,
  tokens: 30_000,
  journeys: 15_000,
  journey: 15_000,
  runs: 10_000,
  /** A stored run never changes. */
  run: Infinity,
  timings: 30_000,
  schedulePreview: 30_000,
  /** A HAR import's draft, handed to the editor; it is replaced by the next import. */
  importedDraft: Infinity,
  vantages: 5_000,
  secrets: 30_000,
  targetRules: 30_000,
  retention: 30_000,
  services: 60_000,
  /** A service's signal list: new signals appear as metrics arrive, rarely. */
  signals: 60_000,
  signalQuery: 15_000,
  collectionTargets: 15_000,
} as const;

// How often live data on screen refreshes itself.
export const REFETCH_INTERVALS = {
  health: 15_000,
  workers: 10_000,
  journeys: 30_000,
  journey: 30_000,
  vantages: 10_000,
  signalQuery: 30_000,
  /** Targets show when they last ran and what went wrong. */
  collectionTargets: 15_000,
} as const;
