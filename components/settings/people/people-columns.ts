import type { ViewStyle } from 'react-native';

// Column proportions shared by the table header and its rows so they line up.
export const PEOPLE_COLUMNS = {
  person: { flex: 3, minWidth: 0 },
  role: { flex: 2, minWidth: 176 },
  status: { flex: 1.3, minWidth: 96 },
  lastSignIn: { flex: 1.4, minWidth: 96 },
  actions: { flex: 1.6, minWidth: 120, flexDirection: 'row', justifyContent: 'flex-end' },
} satisfies Record<string, ViewStyle>;
