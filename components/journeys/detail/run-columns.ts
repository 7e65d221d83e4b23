import type { ViewStyle } from 'react-native';

// Column proportions shared by the run history's header and its rows so they line up.
export const RUN_COLUMNS = {
  verdict: { width: 88 },
  slot: { flex: 2, minWidth: 190 },
  vantage: { flex: 1.2, minWidth: 90 },
  duration: { flex: 1, minWidth: 80, alignItems: 'flex-end' },
  what: { flex: 3, minWidth: 0 },
  open: { width: 20 },
} satisfies Record<string, ViewStyle>;
