import type { ReactNode } from 'react';
import { View } from 'react-native';
import { useTheme } from '../theme';
import { Button } from '../ui/button';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { Wordmark } from '../ui/wordmark';
import { describeError } from '../format/describe-error';

function Centre({ children }: { children: ReactNode }) {
  const theme = useTheme();
  return (
    <View
      style={{
        flex: 1,
        alignItems: 'center',
        justifyContent: 'center',
        backgroundColor: theme.colors.paper,
        padding: theme.space.xl,
        gap: theme.space.xl,
      }}
    >
      {children}
    </View>
  );
}

/** Shown for the moment it takes to ask the server who is signed in. */
export function SessionWaiting() {
  return (
    <Centre>
      <Wordmark size="large" />
      <Loading label="Opening Parallax…" />
    </Centre>
  );
}

export function SessionProblem({ error, onRetry }: { error: unknown; onRetry: () => void }) {
  const theme = useTheme();
  return (
    <Centre>
      <Wordmark size="large" />
      <View style={{ maxWidth: theme.sizes.formMax, width: '100%', gap: theme.space.lg }}>
        <Notice tone="bad" title="Parallax cannot reach its server">
          {describeError(error)}
        </Notice>
        <Button label="Try again" kind="primary" onPress={onRetry} testID="session-retry" />
      </View>
    </Centre>
  );
}
