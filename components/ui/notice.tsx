import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { StatusShape, type StatusTone } from './status-mark';
import { Text } from './text';

export type NoticeTone = 'info' | 'good' | 'bad' | 'caution';

/** A sentence with a mark beside it: form results, warnings, refusals. */
export function Notice({
  tone,
  title,
  children,
  testID,
}: {
  tone: NoticeTone;
  title?: string;
  children?: ReactNode;
  testID?: string;
}) {
  const theme = useTheme();
  const c = theme.colors;
  const wash = { info: c.accentWash, good: c.goodWash, bad: c.badWash, caution: c.cautionWash }[tone];
  const edge = { info: c.accent, good: c.good, bad: c.bad, caution: c.caution }[tone];
  const mark: StatusTone = tone === 'info' ? 'off' : tone;
  return (
    <View
      testID={testID}
      accessibilityRole={tone === 'bad' ? 'alert' : undefined}
      style={{
        flexDirection: 'row',
        gap: theme.space.md,
        backgroundColor: wash,
        borderLeftWidth: theme.sizes.accentEdge,
        borderLeftColor: edge,
        borderRadius: theme.radii.md,
        paddingVertical: theme.space.md,
        paddingHorizontal: theme.space.lg,
      }}
    >
      <View style={{ paddingTop: theme.sizes.markOffsetSmall }}>
        <StatusShape tone={mark} />
      </View>
      <View style={{ flex: 1, gap: theme.space.xs }}>
        {title ? <Text variant="bodyStrong">{title}</Text> : null}
        {typeof children === 'string' ? <Text variant="small">{children}</Text> : children}
      </View>
    </View>
  );
}
