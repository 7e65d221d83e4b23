import { ActivityIndicator, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './text';

export function Loading({ label }: { label: string }) {
  const theme = useTheme();
  return (
    <View
      accessibilityRole="progressbar"
      accessibilityLabel={label}
      style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md, paddingVertical: theme.space.md }}
    >
      <ActivityIndicator size="small" color={theme.colors.inkMuted} />
      <Text variant="small" tone="muted">
        {label}
      </Text>
    </View>
  );
}
