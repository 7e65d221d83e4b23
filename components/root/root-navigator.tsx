import { Stack } from 'expo-router';
import { StatusBar } from 'expo-status-bar';
import { useSessionQuery } from '../../hooks/queries/session';
import { useTheme } from '../theme';
import { SessionProblem, SessionWaiting } from './session-states';

/**
 * Signed-out people can reach only sign-in (and the not-found page); signed-in people never see
 * sign-in. Expo Router removes a guarded group from the navigator and sends the visitor to the
 * first screen still available.
 */
export function RootNavigator() {
  const theme = useTheme();
  const session = useSessionQuery();

  if (session.isPending) return <SessionWaiting />;
  if (session.isError && !session.data) return <SessionProblem error={session.error} onRetry={() => void session.refetch()} />;

  const signedIn = Boolean(session.data?.user);
  return (
    <>
      <StatusBar style={theme.scheme === 'dark' ? 'light' : 'dark'} />
      <Stack screenOptions={{ headerShown: false, contentStyle: { backgroundColor: theme.colors.paper } }}>
        <Stack.Protected guard={!signedIn}>
          <Stack.Screen name="sign-in" options={{ title: 'Sign in · Parallax' }} />
        </Stack.Protected>
        <Stack.Protected guard={signedIn}>
          <Stack.Screen name="(app)" options={{ title: 'Parallax' }} />
        </Stack.Protected>
        <Stack.Screen name="+not-found" options={{ title: 'Not found · Parallax' }} />
      </Stack>
    </>
  );
}
