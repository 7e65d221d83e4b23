import type { ViewStyle } from 'react-native';

// Column proportions shared by the journeys table header and its rows so they line up.
export const JOURNEY_COLUMNS = {
  name: { flex: 3, minWidth: 0 },
  lastRun: { flex: 2, minWidth: 150 },
  passRate: { flex: 2.2, minWidth: 190 },
  p95: { flex: 1, minWidth: 90, alignItems: 'flex-end' },
  vantages: { flex: 1.8, minWidth: 120 },
} satisfies Record<string, ViewStyle>;
