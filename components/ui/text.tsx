import { Text as NativeText, type TextProps as NativeTextProps, type StyleProp, type TextStyle } from 'react-native';
import { useTheme, type TypeVariant } from '../theme';

export type TextTone = 'ink' | 'muted' | 'faint' | 'accent' | 'good' | 'bad' | 'caution' | 'onAccent';

export interface TextProps extends Omit<NativeTextProps, 'style'> {
  variant?: TypeVariant;
  tone?: TextTone;
  align?: TextStyle['textAlign'];
  style?: StyleProp<TextStyle>;
}

/** All text goes through here so the shipped faces and the palette apply everywhere. */
export function Text({ variant = 'body', tone = 'ink', align, style, ...rest }: TextProps) {
  const theme = useTheme();
  const colors = theme.colors;
  const color: Record<TextTone, string> = {
    ink: colors.ink,
    muted: colors.inkMuted,
    faint: colors.inkFaint,
    accent: colors.accent,
    good: colors.good,
    bad: colors.bad,
    caution: colors.caution,
    onAccent: colors.accentInk,
  };
  return (
    <NativeText
      {...rest}
      style={[theme.type[variant], { color: color[tone] }, align ? { textAlign: align } : null, style]}
    />
  );
}
