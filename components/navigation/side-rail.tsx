import { Pressable, View } from 'react-native';
import { useSessionUser } from '../../hooks/queries/session';
import { ROLE_LABELS } from '../../shared/roles';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { Wordmark } from '../ui/wordmark';
import { SignOutButton } from './sign-out-button';
import type { TabBarProps } from './tab-bar-types';
import { usePlacePress } from './use-place-press';

/** Wide screens: the wordmark, the places, and who is signed in, down the left edge. */
export function SideRail({ state, descriptors, navigation }: TabBarProps) {
  const theme = useTheme();
  const c = theme.colors;
  const user = useSessionUser();
  const press = usePlacePress({ state, navigation });
  return (
    <View
      style={{
        width: theme.sizes.railWidth,
        backgroundColor: c.paper,
        borderRightWidth: theme.borders.hairline,
        borderRightColor: c.line,
        paddingHorizontal: theme.space.lg,
        paddingTop: theme.space.xl,
        paddingBottom: theme.space.lg,
        justifyContent: 'space-between',
      }}
    >
      <View style={{ gap: theme.space.xxl }}>
        <View style={{ paddingHorizontal: theme.space.sm }}>
          <Wordmark />
        </View>
        <View accessibilityRole="tablist" style={{ gap: theme.space.xs }}>
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
                style={({ hovered }: { pressed: boolean; hovered?: boolean }) => ({
                  flexDirection: 'row',
                  alignItems: 'center',
                  gap: theme.space.md,
                  minHeight: theme.sizes.touchTarget,
                  paddingHorizontal: theme.space.md,
                  borderRadius: theme.radii.md,
                  backgroundColor: focused ? c.accentWash : hovered ? c.sunken : 'transparent',
                })}
              >
                {options.tabBarIcon?.({ focused, color, size: theme.sizes.icon })}
                <Text variant={focused ? 'bodyStrong' : 'body'} style={{ color }}>
                  {title}
                </Text>
              </Pressable>
            );
          })}
        </View>
      </View>
      <View style={{ gap: theme.space.sm, borderTopWidth: theme.borders.hairline, borderTopColor: c.line, paddingTop: theme.space.lg }}>
        {user ? (
          <View style={{ paddingHorizontal: theme.space.md, gap: theme.space.xxs }}>
            <Text variant="smallStrong" numberOfLines={1}>
              {user.name}
            </Text>
            <Text variant="caption" tone="muted" numberOfLines={1}>
              {ROLE_LABELS[user.role]}
            </Text>
          </View>
        ) : null}
        <SignOutButton wide />
      </View>
    </View>
  );
}
