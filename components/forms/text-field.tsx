import { forwardRef, useState } from 'react';
import { TextInput, View, type TextInputProps } from 'react-native';
import { useTheme } from '../theme';
import { FieldMessage } from './field-message';
import { Text } from '../ui/text';

export interface TextFieldProps
  extends Pick<
    TextInputProps,
    | 'value'
    | 'onChangeText'
    | 'secureTextEntry'
    | 'autoComplete'
    | 'keyboardType'
    | 'autoCapitalize'
    | 'onSubmitEditing'
    | 'returnKeyType'
    | 'placeholder'
    | 'textContentType'
    | 'multiline'
    | 'numberOfLines'
    | 'editable'
  > {
  label: string;
  hint?: string;
  error?: string;
  testID: string;
  mono?: boolean;
}

export const TextField = forwardRef<TextInput, TextFieldProps>(function TextField(
  { label, hint, error, testID, mono = false, ...input },
  ref,
) {
  const theme = useTheme();
  const c = theme.colors;
  const [focused, setFocused] = useState(false);
  return (
    <View style={{ gap: theme.space.xs, flexGrow: 1 }}>
      <Text variant="label" nativeID={`${testID}-label`}>
        {label}
      </Text>
      <TextInput
        ref={ref}
        testID={testID}
        accessibilityLabel={label}
        autoCorrect={false}
        onFocus={() => setFocused(true)}
        onBlur={() => setFocused(false)}
        placeholderTextColor={c.inkFaint}
        style={[
          mono ? theme.type.code : theme.type.body,
          {
            color: c.ink,
            backgroundColor: c.surface,
            borderWidth: focused ? theme.borders.strong : theme.borders.hairline,
            borderColor: error ? c.bad : focused ? c.focus : c.lineStrong,
            borderRadius: theme.radii.md,
            minHeight: theme.sizes.touchTarget,
            // Keep the text still when the border thickens on focus.
            paddingHorizontal: focused ? theme.space.md - 1 : theme.space.md,
            paddingVertical: theme.space.sm,
            outlineWidth: 0,
          },
          input.multiline ? { minHeight: theme.sizes.touchTarget * 2, textAlignVertical: 'top' } : null,
        ]}
        {...input}
      />
      <FieldMessage error={error} hint={hint} />
    </View>
  );
});
