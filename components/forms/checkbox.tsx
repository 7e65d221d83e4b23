import { Pressable, View } from 'react-native';
import { useTheme } from '../theme';
import { Icon } from '../ui/icon';
import { Text } from '../ui/text';

export interface CheckboxProps {
  checked: boolean;
  onChange: (checked: boolean) => void;
  label: string;
  detail?: string;
  testID: string;
}

export function Checkbox({ checked, onChange, label, detail, testID }: CheckboxProps) {
  const theme = useTheme();
  const c = theme.colors;
  const box = theme.sizes.checkbox;
  return (
    <Pressable
      testID={testID}
      accessibilityRole="checkbox"
      accessibilityState={{ checked }}
      accessibilityLabel={label}
      onPress={() => onChange(!checked)}
      style={{ flexDirection: 'row', alignItems: 'flex-start', gap: theme.space.md, minHeight: theme.sizes.touchTarget, paddingVertical: theme.space.xs }}
    >
      <View
        style={{
          width: box,
          height: box,
          borderRadius: theme.radii.sm,
          borderWidth: theme.borders.strong,
          borderColor: checked ? c.accent : c.lineStrong,
          backgroundColor: checked ? c.accent : c.surface,
          alignItems: 'center',
          justifyContent: 'center',
        }}
      >
        {checked ? <Icon name="check" size={theme.sizes.iconSm} color={c.accentInk} /> : null}
      </View>
      <View style={{ flexShrink: 1 }}>
        <Text variant="bodyStrong">{label}</Text>
        {detail ? (
          <Text variant="small" tone="muted">
            {detail}
          </Text>
        ) : null}
      </View>
    </Pressable>
  );
}
