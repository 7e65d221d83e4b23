import { View } from 'react-native';
import { useTheme } from './theme';
import { Text } from './ui/text';
import { TextLink } from './ui/text-link';
import { Wordmark } from './ui/wordmark';

export function NotFoundScreen() {
  const theme = useTheme();
  return (
    <View
      testID="not-found"
      style={{ flex: 1, backgroundColor: theme.colors.paper, alignItems: 'center', justifyContent: 'center', padding: theme.space.xl }}
    >
      <View style={{ maxWidth: theme.sizes.formMax, width: '100%', gap: theme.space.lg }}>
        <Wordmark />
        <Text variant="title" accessibilityRole="header">
          There is no page here
        </Text>
        <Text variant="body" tone="muted">
          The address may be mistyped, or the page may belong to a part of Parallax that is not built yet.
        </Text>
        <TextLink href="/" label="Go to Now" testID="not-found-home" />
      </View>
    </View>
  );
}
