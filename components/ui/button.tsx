import { ActivityIndicator, Pressable, StyleSheet, View } from 'react-native';
import { useTheme } from '../theme';
import { Icon, type IconName } from './icon';
import { Text } from './text';

export type ButtonKind = 'primary' | 'secondary' | 'danger' | 'quiet';

export interface ButtonProps {
  label: string;
  onPress: () => void;
  kind?: ButtonKind;
  icon?: IconName;
  disabled?: boolean;
  busy?: boolean;
  compact?: boolean;
  /** Fill the width of its column (the main action of a narrow form). */
  stretch?: boolean;
  testID?: string;
  accessibilityHint?: string;
}

export function Button({
  label,
  onPress,
  kind = 'secondary',
  icon,
  disabled = false,
  busy = false,
  compact = false,
  stretch = false,
  testID,
  accessibilityHint,
}: ButtonProps) {
  const theme = useTheme();
  const c = theme.colors;
  const look = {
    primary: { bg: c.accent, fg: c.accentInk, border: c.accent },
    secondary: { bg: c.surface, fg: c.ink, border: c.lineStrong },
    danger: { bg: c.surface, fg: c.bad, border: c.bad },
    quiet: { bg: 'transparent', fg: c.inkMuted, border: 'transparent' },
  }[kind];
  const inactive = disabled || busy;
  return (
    <Pressable
      testID={testID}
      onPress={onPress}
      disabled={inactive}
      accessibilityRole="button"
      accessibilityLabel={label}
      accessibilityHint={accessibilityHint}
      accessibilityState={{ disabled: inactive, busy }}
      style={({ pressed, hovered }: { pressed: boolean; hovered?: boolean }) => [
        styles.base,
        {
          minHeight: compact ? theme.sizes.compactControl : theme.sizes.touchTarget,
          paddingHorizontal: compact ? theme.space.md : theme.space.lg,
          borderRadius: theme.radii.md,
          borderWidth: theme.borders.hairline,
          backgroundColor: look.bg,
          borderColor: look.border,
          gap: theme.space.sm,
          opacity: inactive ? 0.55 : pressed ? 0.8 : 1,
          alignSelf: stretch ? 'stretch' : 'flex-start',
        },
        hovered && !inactive && kind !== 'primary' ? { backgroundColor: c.sunken } : null,
      ]}
    >
      {busy ? (
        <ActivityIndicator size="small" color={look.fg} />
      ) : icon ? (
        <Icon name={icon} size={theme.sizes.iconSm} color={look.fg} />
      ) : null}
      <View>
        <Text variant={compact ? 'smallStrong' : 'bodyStrong'} style={{ color: look.fg }}>
          {label}
        </Text>
      </View>
    </Pressable>
  );
}

const styles = StyleSheet.create({
  base: { flexDirection: 'row', alignItems: 'center', justifyContent: 'center', alignSelf: 'flex-start' },
});
