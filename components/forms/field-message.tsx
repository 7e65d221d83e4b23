import { View } from 'react-native';
import { useTheme } from '../theme';
import { StatusShape } from '../ui/status-mark';
import { Text } from '../ui/text';

/** The line under a field: its error (with a mark, not just red) or else its hint. */
export function FieldMessage({ error, hint }: { error?: string; hint?: string }) {
  const theme = useTheme();
  if (error) {
    return (
      <View accessibilityRole="alert" style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <StatusShape tone="bad" size={theme.sizes.markSmall} />
        <Text variant="small" tone="bad" style={{ flexShrink: 1 }}>
          {error}
        </Text>
      </View>
    );
  }
  if (hint) {
    return (
      <Text variant="small" tone="muted">
        {hint}
      </Text>
    );
  }
  return null;
}
