import { View } from 'react-native';
import { useSafeAreaInsets } from 'react-native-safe-area-context';
import { useTheme } from '../theme';
import { Wordmark } from '../ui/wordmark';
import { SignOutButton } from './sign-out-button';

/** Phones and tablets: the name of the product and the way out, above every place. */
export function TopBar() {
  const theme = useTheme();
  const insets = useSafeAreaInsets();
  return (
    <View
      style={{
        flexDirection: 'row',
        alignItems: 'center',
        justifyContent: 'space-between',
        paddingTop: insets.top,
        paddingLeft: theme.space.lg,
        paddingRight: theme.space.sm,
        minHeight: theme.sizes.topBarHeight + insets.top,
        backgroundColor: theme.colors.paper,
        borderBottomWidth: theme.borders.hairline,
        borderBottomColor: theme.colors.line,
      }}
    >
      <Wordmark />
      <SignOutButton />
    </View>
  );
}
