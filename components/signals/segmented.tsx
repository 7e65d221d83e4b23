import { Pressable, View } from 'react-native';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Text } from '../ui/text';

export interface SegmentOption<V extends string> {
  value: V;
  label: string;
}

/**
 * A row of joined buttons, one chosen (or several with `multi`): for a handful of choices a
 * thumb can reach at once. The chosen ones get a thicker border and a wash as well as colour.
 */
export function Segmented<V extends string>({
  label,
  options,
  selected,
  onSelect,
  testID,
}: {
  label?: string;
  options: readonly SegmentOption<V>[];
  selected: readonly V[];
  onSelect: (value: V) => void;
  testID: string;
}) {
  const theme = useTheme();
  const c = theme.colors;
  const { isPhone } = useBreakpoints();
  return (
    <View style={{ gap: theme.space.xs }}>
      {label ? <Text variant="label">{label}</Text> : null}
      <View testID={testID} accessibilityRole="radiogroup" accessibilityLabel={label} style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.xs }}>
        {options.map((option) => {
          const on = selected.includes(option.value);
          return (
            <Pressable
              key={option.value}
              testID={`${testID}-${option.value}`}
              accessibilityRole="radio"
              accessibilityState={{ checked: on }}
              accessibilityLabel={option.label}
              onPress={() => onSelect(option.value)}
              style={({ hovered }: { pressed: boolean; hovered?: boolean }) => ({
                minHeight: isPhone ? theme.sizes.touchTarget : theme.sizes.compactControl,
                justifyContent: 'center',
                paddingHorizontal: theme.space.md,
                borderRadius: theme.radii.md,
                borderWidth: on ? theme.borders.strong : theme.borders.hairline,
                borderColor: on ? c.accent : c.lineStrong,
                backgroundColor: on ? c.accentWash : hovered ? c.sunken : c.surface,
              })}
            >
              <Text variant="smallStrong" tone={on ? 'accent' : 'ink'}>
                {option.label}
              </Text>
            </Pressable>
          );
        })}
      </View>
    </View>
  );
}
