import { View } from 'react-native';
import type { AlertState } from '../../shared/rules/api-schemas';
import { useTheme } from '../theme';
import { StatusMark, type StatusTone } from '../ui/status-mark';

/**
 * Alert states as shape + word + colour: raised = filled diamond, pending = filled triangle,
 * cleared = filled circle, no data = hollow dashed circle, planned = hollow square.
 */
export const ALERT_STATE_LOOK: Record<AlertState | 'planned', { tone: StatusTone; word: string }> = {
  raised: { tone: 'bad', word: 'Raised' },
  pending: { tone: 'caution', word: 'Pending' },
  cleared: { tone: 'good', word: 'Cleared' },
  no_data: { tone: 'missing', word: 'No data' },
  planned: { tone: 'off', word: 'Planned' },
};

export function AlertStateMark({ state, planned = false, testID }: { state: AlertState; planned?: boolean; testID?: string }) {
  const theme = useTheme();
  const look = ALERT_STATE_LOOK[state];
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.sm }}>
      <StatusMark tone={look.tone} label={look.word} chip testID={testID} />
      {planned ? <StatusMark tone="off" label="Planned" chip testID={testID ? `${testID}-planned` : undefined} /> : null}
    </View>
  );
}
