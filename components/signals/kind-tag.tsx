import { View } from 'react-native';
import type { SignalKind } from '../../shared/schemas/signals';
import { useTheme } from '../theme';
import { Text } from '../ui/text';

export const KIND_LABELS: Record<SignalKind, string> = { counter: 'counter', gauge: 'gauge', histogram: 'histogram' };

/** A signal's kind as a word in a quiet outlined tag (words, not colours, tell kinds apart). */
export function KindTag({ kind, testID }: { kind: SignalKind; testID?: string }) {
  const theme = useTheme();
  return (
    <View
      testID={testID}
      style={{
        alignSelf: 'flex-start',
        borderWidth: theme.borders.hairline,
        borderColor: theme.colors.lineStrong,
        borderRadius: theme.radii.sm,
        paddingHorizontal: theme.space.sm,
        paddingVertical: theme.space.xxs,
      }}
    >
      <Text variant="caption" tone="muted">
        {KIND_LABELS[kind]}
      </Text>
    </View>
  );
}
