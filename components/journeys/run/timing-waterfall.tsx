import { View } from 'react-native';
import { phaseDurations, type StepTimings } from '../../../shared/journey/run-result';
import { formatMs, formatPhaseMs } from '../../format/duration';
import { useTheme } from '../../theme';
import { Text } from '../../ui/text';

interface Phase {
  key: string;
  label: string;
  /** Start, milliseconds since the step began. */
  start: number;
  duration: number | null;
  /** Why a phase has no duration, in words. */
  absent: string;
}

/**
 * The phases of one step in order, from the milestones the prober recorded. Time before the final
 * request is the redirects followed, or (with none) the prober's own preparation.
 */
export function stepPhases(t: StepTimings, redirected: boolean): Phase[] {
  const d = phaseDurations(t);
  const afterDns = t.dnsMs ?? t.redirectMs;
  const afterConnect = t.connectMs ?? afterDns;
  const afterTls = t.tlsMs ?? afterConnect;
  const phases: Phase[] = [
    { key: 'redirect', label: redirected ? 'Redirects' : 'Preparing', start: 0, duration: d.redirect > 0 ? d.redirect : null, absent: 'none' },
    { key: 'dns', label: 'DNS', start: t.redirectMs, duration: d.dns, absent: 'no lookup (an address)' },
    { key: 'connect', label: 'Connect', start: afterDns, duration: d.connect, absent: 'not reached' },
    { key: 'tls', label: 'TLS', start: afterConnect, duration: d.tls, absent: t.connectMs === null ? 'not reached' : 'none (plain HTTP)' },
    { key: 'wait', label: 'Wait', start: afterTls, duration: d.wait, absent: 'no response' },
    { key: 'download', label: 'Download', start: t.ttfbMs ?? afterTls, duration: d.download, absent: 'no response' },
  ];
  // The time before the request is listed only when there was some; every other phase always has its row.
  return phases.filter((p) => p.key !== 'redirect' || p.duration !== null);
}

/**
 * A waterfall: one labelled row per phase, each bar starting where the previous phase ended, on a
 * shared scale of the step's total time.
 */
export function TimingWaterfall({ timings, redirected, testID }: { timings: StepTimings; redirected: boolean; testID?: string }) {
  const theme = useTheme();
  const c = theme.colors;
  const total = Math.max(timings.totalMs, 0.001);
  const pct = (ms: number) => `${Math.min(100, Math.max(0, (ms / total) * 100))}%` as const;
  return (
    <View testID={testID} accessibilityLabel={`Timing waterfall, total ${formatMs(timings.totalMs)}`} style={{ gap: theme.space.xs }}>
      {stepPhases(timings, redirected).map((phase) => (
        <View key={phase.key} testID={testID ? `${testID}-${phase.key}` : undefined} style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
          <Text variant="small" tone="muted" style={{ width: theme.sizes.waterfallLabel }}>
            {phase.label}
          </Text>
          <View style={{ flex: 1, justifyContent: 'center' }}>
            {phase.duration === null ? (
              // No bar for a phase that did not happen; say why on its row instead.
              <Text variant="caption" tone="faint" numberOfLines={1}>
                {phase.absent}
              </Text>
            ) : (
              <View style={{ height: theme.sizes.waterfallBar, backgroundColor: c.sunken, borderRadius: theme.radii.sm, overflow: 'hidden' }}>
                <View
                  style={{
                    position: 'absolute',
                    top: 0,
                    bottom: 0,
                    left: pct(phase.start),
                    width: pct(phase.duration),
                    minWidth: theme.borders.strong,
                    // Waiting for the server's answer is usually the phase that matters.
                    backgroundColor: phase.key === 'wait' ? c.accent : c.inkMuted,
                    borderRadius: theme.radii.sm,
                  }}
                />
              </View>
            )}
          </View>
          <Text variant="numberSmall" tone={phase.duration !== null ? 'ink' : 'faint'} align="right" style={{ width: theme.sizes.waterfallValue }} numberOfLines={1}>
            {phase.duration !== null ? formatPhaseMs(phase.duration) : '—'}
          </Text>
        </View>
      ))}
      <View style={{ flexDirection: 'row', justifyContent: 'flex-end', gap: theme.space.sm, paddingTop: theme.space.xs }}>
        <Text variant="smallStrong">Total</Text>
        <Text variant="numberSmall" testID={testID ? `${testID}-total` : undefined}>
          {formatMs(timings.totalMs)}
        </Text>
      </View>
    </View>
  );
}
