import { Text } from '../ui/text';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { FieldMessage } from './field-message';
import type { FileFieldProps } from './file-field.types';

// Phones and tablets have no HAR files to hand (they are recorded in a desktop browser), so the
// native app says where to do it instead of offering a picker.
export function FileField({ label, error, testID }: FileFieldProps) {
  const theme = useTheme();
  return (
    <View testID={testID} style={{ gap: theme.space.xs }}>
      <Text variant="label">{label}</Text>
      <Text variant="small" tone="muted">
        Upload files from Parallax in a desktop browser.
      </Text>
      <FieldMessage error={error} />
    </View>
  );
}
