import { ScrollView, View } from 'react-native';
import { useBreakpoints } from '../../hooks/use-breakpoints';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { Wordmark } from '../ui/wordmark';
import { SignInForm } from './sign-in-form';

/** Outer part: the calm page around the form. */
export function SignInScreen() {
  const theme = useTheme();
  const { isPhone } = useBreakpoints();
  return (
    <ScrollView
      style={{ flex: 1, backgroundColor: theme.colors.paper }}
      contentContainerStyle={{
        flexGrow: 1,
        justifyContent: 'center',
        alignItems: 'center',
        paddingHorizontal: isPhone ? theme.space.lg : theme.space.xxl,
        paddingVertical: theme.space.xxxl,
      }}
      keyboardShouldPersistTaps="handled"
    >
      <View style={{ width: '100%', maxWidth: theme.sizes.formMax, gap: theme.space.xxl }}>
        <View style={{ gap: theme.space.md }}>
          <Wordmark size="large" />
          <Text variant="body" tone="muted">
            What your customers meet, lined up with what your service reports about itself.
          </Text>
        </View>
        <View
          style={{
            backgroundColor: theme.colors.surface,
            borderColor: theme.colors.line,
            borderWidth: theme.borders.hairline,
            borderRadius: theme.radii.lg,
            padding: isPhone ? theme.space.xl : theme.space.xxl,
            gap: theme.space.xl,
          }}
        >
          <Text variant="title" accessibilityRole="header">
            Sign in
          </Text>
          <SignInForm />
        </View>
        <Text variant="small" tone="muted">
          First time here? When Parallax starts with no users, <Text variant="code">npm start</Text> prints the first
          admin&apos;s email and password in its output.
        </Text>
      </View>
    </ScrollView>
  );
}
