import { View } from 'react-native';
import type { JourneySummary } from '../../../shared/schemas/journeys';
import { formatRelative } from '../../format/time';
import { useTheme } from '../../theme';
import { StatusMark } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { VerdictMark } from '../verdict-mark';

/** The last run's verdict and when it ran, or an honest "no runs yet". */
export function LastRun({ journey, compact = false }: { journey: JourneySummary; compact?: boolean }) {
  const theme = useTheme();
  const last = journey.lastRun;
  if (!last) {
    return (
      <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
        <StatusMark tone="off" label="No runs yet" />
      </View>
    );
  }
  return (
    <View style={{ gap: theme.space.xxs, flexDirection: compact ? 'row' : 'column', alignItems: compact ? 'center' : 'flex-start', columnGap: theme.space.sm }}>
      <VerdictMark verdict={last.verdict} testID={`journey-verdict-${journey.id}`} />
      <Text variant="numberSmall" tone="muted">
        {formatRelative(last.slotAt)}
      </Text>
    </View>
  );
}

/** A journey that is switched off says so with a shape and a word. */
export function PausedTag({ enabled }: { enabled: boolean }) {
  if (enabled) return null;
  return <StatusMark tone="off" label="Paused" />;
}
