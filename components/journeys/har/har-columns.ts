import type { ViewStyle } from 'react-native';

// Column proportions shared by the entry preview's header and its rows so they line up.
export const HAR_COLUMNS = {
  kept: { width: 104 },
  method: { width: 72 },
  url: { flex: 4, minWidth: 0 },
  status: { width: 56, alignItems: 'flex-end' },
  kind: { flex: 2, minWidth: 110 },
  time: { width: 80, alignItems: 'flex-end' },
} satisfies Record<string, ViewStyle>;
