import { Pressable, View } from 'react-native';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import type { TabBarProps } from './tab-bar-types';
import { usePlacePress } from './use-place-press';

/** Phones and tablets: every place along the bottom, icon over a short word. */
export function BottomBar({ state, descriptors, navigation, insets }: TabBarProps) {
  const theme = useTheme();
  const c = theme.colors;
  const press = usePlacePress({ state, navigation });
  return (
    <View
      accessibilityRole="tablist"
      style={{
        flexDirection: 'row',
        backgroundColor: c.surface,
        borderTopWidth: theme.borders.hairline,
        borderTopColor: c.line,
        paddingBottom: insets.bottom,
        paddingHorizontal: theme.space.xs,
      }}
    >
      {state.routes.map((route, index) => {
        const { options } = descriptors[route.key];
        const focused = state.index === index;
        const color = focused ? c.accent : c.inkMuted;
        const title = options.title ?? route.name;
        return (
          <Pressable
            key={route.key}
            testID={options.tabBarButtonTestID}
            accessibilityRole="tab"
            accessibilityState={{ selected: focused }}
            accessibilityLabel={title}
            onPress={() => press(index)}
            style={{
              flex: 1,
              minHeight: theme.sizes.tabBarHeight,
              alignItems: 'center',
              justifyContent: 'center',
              gap: theme.space.xxs,
            }}
          >
            {/* The current place gets a bar above it as well as the accent colour. */}
            <View
              style={{
                position: 'absolute',
                top: 0,
                left: theme.space.sm,
                right: theme.space.sm,
                height: theme.sizes.indicator,
                borderBottomLeftRadius: theme.radii.sm,
                borderBottomRightRadius: theme.radii.sm,
                backgroundColor: focused ? c.accent : 'transparent',
              }}
            />
            {options.tabBarIcon?.({ focused, color, size: theme.sizes.icon })}
            <Text variant="tab" numberOfLines={1} style={{ color }}>
              {title}
            </Text>
          </Pressable>
        );
      })}
    </View>
  );
}
