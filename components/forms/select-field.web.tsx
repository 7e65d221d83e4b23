import { useState, type ChangeEvent, type CSSProperties } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { FieldMessage } from './field-message';
import type { SelectFieldProps } from './select-field.types';

// The browser's own <select>: keyboard, screen readers and phone pickers come for free.
export function SelectField<V extends string>({
  label,
  accessibilityLabel,
  value,
  options,
  onChange,
  disabled = false,
  error,
  hint,
  testID,
  compact = false,
}: SelectFieldProps<V>) {
  const theme = useTheme();
  const c = theme.colors;
  const [focused, setFocused] = useState(false);
  const style: CSSProperties = {
    fontFamily: theme.fonts.sans,
    fontSize: theme.type[compact ? 'small' : 'body'].fontSize,
    color: c.ink,
    backgroundColor: c.surface,
    border: `${focused ? theme.borders.strong : theme.borders.hairline}px solid ${error ? c.bad : focused ? c.focus : c.lineStrong}`,
    borderRadius: theme.radii.md,
    minHeight: compact ? theme.sizes.compactControl : theme.sizes.touchTarget,
    padding: `0 ${theme.space.md}px`,
    outline: 'none',
    cursor: disabled ? 'not-allowed' : 'pointer',
    opacity: disabled ? 0.55 : 1,
    width: '100%',
    // The open list follows the light or dark palette too.
    colorScheme: theme.scheme,
  };
  return (
    <View style={{ gap: theme.space.xs, flexGrow: 1 }}>
      {label ? <Text variant="label">{label}</Text> : null}
      <select
        data-testid={testID}
        aria-label={accessibilityLabel}
        aria-invalid={error ? true : undefined}
        value={value}
        disabled={disabled}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        onChange={(event: ChangeEvent<HTMLSelectElement>) => onChange(event.target.value as V)}
        style={style}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      <FieldMessage error={error} hint={hint} />
    </View>
  );
}
