import { Pressable, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { FieldMessage } from './field-message';
import type { SelectFieldProps } from './select-field.types';

// On phones and tablets the options are few (roles, scopes), so they are shown as a row of choices.
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
}: SelectFieldProps<V>) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View style={{ gap: theme.space.xs }}>
      {label ? <Text variant="label">{label}</Text> : null}
      <View testID={testID} accessibilityRole="radiogroup" accessibilityLabel={accessibilityLabel} style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
        {options.map((option) => {
          const selected = option.value === value;
          return (
            <Pressable
              key={option.value}
              testID={`${testID}-${option.value}`}
              accessibilityRole="radio"
              accessibilityState={{ checked: selected, disabled }}
              disabled={disabled}
              onPress={() => onChange(option.value)}
              style={{
                minHeight: theme.sizes.touchTarget,
                justifyContent: 'center',
                paddingHorizontal: theme.space.md,
                borderRadius: theme.radii.md,
                borderWidth: selected ? theme.borders.strong : theme.borders.hairline,
                borderColor: selected ? c.accent : c.lineStrong,
                backgroundColor: selected ? c.accentWash : c.surface,
              }}
            >
              <Text variant="smallStrong" tone={selected ? 'accent' : 'ink'}>
                {option.label}
              </Text>
            </Pressable>
          );
        })}
      </View>
      <FieldMessage error={error} hint={hint} />
    </View>
  );
}
