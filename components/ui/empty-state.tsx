import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { StatusShape } from './status-mark';
import { Text } from './text';

/** Says plainly that nothing is here yet, and what to do about it. */
export function EmptyState({
  title,
  body,
  children,
  testID,
}: {
  title: string;
  body?: string;
  children?: ReactNode;
  testID?: string;
}) {
  const theme = useTheme();
  return (
    <View testID={testID} style={{ flexDirection: 'row', gap: theme.space.md }}>
      <View style={{ paddingTop: theme.sizes.markOffsetBody }}>
        <StatusShape tone="missing" />
      </View>
      <View style={{ flex: 1, gap: theme.space.sm }}>
        <Text variant="bodyStrong">{title}</Text>
        {body ? (
          <Text variant="body" tone="muted">
            {body}
          </Text>
        ) : null}
        {children}
      </View>
    </View>
  );
}
