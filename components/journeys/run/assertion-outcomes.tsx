import { View } from 'react-native';
import type { AssertionOutcome } from '../../../shared/journey/run-result';
import { useTheme } from '../../theme';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';

/** Each check of a step: what it asked for and what the response had, side by side. */
export function AssertionOutcomes({ outcomes, testID }: { outcomes: AssertionOutcome[]; testID?: string }) {
  const theme = useTheme();
  if (outcomes.length === 0) {
    return (
      <Text variant="small" tone="muted">
        No assertions: any response that arrives counts as a pass.
      </Text>
    );
  }
  return (
    <View testID={testID} style={{ gap: theme.space.sm }}>
      {outcomes.map((a, i) => (
        <View
          key={i}
          testID={testID ? `${testID}-${i}` : undefined}
          style={{
            gap: theme.space.xs,
            paddingTop: i > 0 ? theme.space.sm : 0,
            borderTopWidth: i > 0 ? theme.borders.hairline : 0,
            borderTopColor: theme.colors.line,
          }}
        >
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.md }}>
            <StatusMark tone={a.passed ? 'good' : 'bad'} label={a.passed ? 'Held' : 'Broke'} />
            <Text variant="small" tone="muted">
              {a.kind}
            </Text>
          </View>
          <View style={{ flexDirection: 'row', gap: theme.space.md }}>
            <Pair label="Expected" value={a.expected} />
            <Pair label="Actual" value={a.actual} bad={!a.passed} />
          </View>
        </View>
      ))}
    </View>
  );
}

function Pair({ label, value, bad = false }: { label: string; value: string; bad?: boolean }) {
  const theme = useTheme();
  return (
    <View style={{ flex: 1, gap: theme.space.xxs }}>
      <Text variant="caption" tone="faint">
        {label}
      </Text>
      <Text variant="code" tone={bad ? 'bad' : 'ink'} selectable style={{ wordBreak: 'break-word' } as object}>
        {value}
      </Text>
    </View>
  );
}
