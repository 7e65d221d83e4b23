import { Pressable } from 'react-native';
import { useTheme } from '../theme';
import { Icon, type IconName } from './icon';

/** A small square button with only an icon; its label is still read out and shown as a tooltip. */
export function IconButton({
  icon,
  label,
  onPress,
  disabled = false,
  tone = 'muted',
  testID,
}: {
  icon: IconName;
  label: string;
  onPress: () => void;
  disabled?: boolean;
  tone?: 'muted' | 'bad';
  testID: string;
}) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <Pressable
      testID={testID}
      onPress={onPress}
      disabled={disabled}
      accessibilityRole="button"
      accessibilityLabel={label}
      accessibilityState={{ disabled }}
      // The browser's own tooltip names an icon-only button for sighted mouse users.
      {...({ title: label } as object)}
      style={({ pressed, hovered }: { pressed: boolean; hovered?: boolean }) => ({
        width: theme.sizes.orderButton,
        height: theme.sizes.orderButton,
        alignItems: 'center',
        justifyContent: 'center',
        borderRadius: theme.radii.md,
        borderWidth: theme.borders.hairline,
        borderColor: c.line,
        backgroundColor: hovered && !disabled ? c.sunken : c.surface,
        opacity: disabled ? 0.4 : pressed ? 0.7 : 1,
      })}
    >
      <Icon name={icon} size={theme.sizes.iconSm} color={tone === 'bad' ? c.bad : c.inkMuted} />
    </Pressable>
  );
}
