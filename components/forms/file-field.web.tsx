import { useState, type ChangeEvent, type CSSProperties } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { FieldMessage } from './field-message';
import type { FileFieldProps, PickedFile } from './file-field.types';

// The browser's own file input: keyboard, screen readers and drag-and-drop onto it come for free.
export function FileField({ label, accept, value, onChange, error, hint, testID }: FileFieldProps) {
  const theme = useTheme();
  const c = theme.colors;
  const [focused, setFocused] = useState(false);
  const style: CSSProperties = {
    fontFamily: theme.fonts.sans,
    fontSize: theme.type.small.fontSize,
    color: c.ink,
    backgroundColor: c.surface,
    border: `${focused ? theme.borders.strong : theme.borders.hairline}px ${value ? 'solid' : 'dashed'} ${error ? c.bad : focused ? c.focus : c.lineStrong}`,
    borderRadius: theme.radii.md,
    padding: theme.space.md,
    minHeight: theme.sizes.touchTarget,
    width: '100%',
    boxSizing: 'border-box',
    cursor: 'pointer',
    colorScheme: theme.scheme,
  };
  return (
    <View style={{ gap: theme.space.xs }}>
      <Text variant="label">{label}</Text>
      <input
        type="file"
        data-testid={testID}
        aria-label={label}
        aria-invalid={error ? true : undefined}
        accept={accept}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        onChange={(event: ChangeEvent<HTMLInputElement>) => onChange((event.target.files?.[0] as PickedFile | undefined) ?? null)}
        style={style}
      />
      <FieldMessage error={error} hint={hint} />
    </View>
  );
}
