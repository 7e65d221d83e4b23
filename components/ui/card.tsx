import type { ReactNode } from 'react';
import { View, type StyleProp, type ViewStyle } from 'react-native';
import { useTheme } from '../theme';
import { Text } from './text';

export interface CardProps {
  title?: string;
  description?: string;
  /** Right side of the title row (a count, a small action). */
  aside?: ReactNode;
  children?: ReactNode;
  style?: StyleProp<ViewStyle>;
  testID?: string;
}

/** A quiet panel on the paper: hairline border, no shadow. */
export function Card({ title, description, aside, children, style, testID }: CardProps) {
  const theme = useTheme();
  return (
    <View
      testID={testID}
      style={[
        {
          backgroundColor: theme.colors.surface,
          borderColor: theme.colors.line,
          borderWidth: theme.borders.hairline,
          borderRadius: theme.radii.lg,
          padding: theme.space.xl,
          gap: theme.space.lg,
        },
        style,
      ]}
    >
      {title ? (
        <View style={{ gap: theme.space.xs }}>
          <View style={{ flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: theme.space.md }}>
            <Text variant="heading" accessibilityRole="header" style={{ flexShrink: 1 }}>
              {title}
            </Text>
            {aside}
          </View>
          {description ? (
            <Text variant="small" tone="muted">
              {description}
            </Text>
          ) : null}
        </View>
      ) : null}
      {children}
    </View>
  );
}
