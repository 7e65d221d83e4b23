import { Slot } from 'expo-router';
import { View } from 'react-native';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { SettingsSections } from './settings-sections';

/** Wide screens: sections on the left, the chosen one on the right. Narrower: one page at a time. */
export function SettingsFrame() {
  const theme = useTheme();
  const { isWide } = useBreakpoints();
  if (!isWide) return <Slot />;
  return (
    <View style={{ flex: 1, flexDirection: 'row', backgroundColor: theme.colors.paper }}>
      <View
        style={{
          width: theme.sizes.settingsListWidth,
          borderRightWidth: theme.borders.hairline,
          borderRightColor: theme.colors.line,
          paddingHorizontal: theme.space.md,
          paddingTop: theme.space.xxl + theme.space.sm,
          gap: theme.space.lg,
        }}
      >
        <Text variant="label" tone="muted" style={{ paddingHorizontal: theme.space.md }}>
          Settings
        </Text>
        <SettingsSections pane />
      </View>
      <View style={{ flex: 1 }}>
        <Slot />
      </View>
    </View>
  );
}
