import { Pressable, View } from 'react-native';
import type { AlertView } from '../../shared/rules/api-schemas';
import { formatRelative } from '../format/time';
import { groupLabel } from '../signals/chart/chart-model';
import { formatNumber } from '../signals/format-value';
import { useTheme } from '../theme';
import { Text } from '../ui/text';
import { AlertStateMark } from './alert-state-mark';

/** When the alert's current state began, in words. */
export function alertWhen(alert: AlertView): string {
  if (alert.state === 'cleared' && alert.clearedAt) return `cleared ${formatRelative(alert.clearedAt)}`;
  if (alert.state === 'raised' && alert.raisedAt) return `raised ${formatRelative(alert.raisedAt)}`;
  if (alert.state === 'pending' && alert.pendingSince) return `pending since ${formatRelative(alert.pendingSince)}`;
  return `opened ${formatRelative(alert.openedAt)}`;
}

/** One alert: what to do first (the responder note) on top, then state, rule and group. */
export function AlertCard({ alert, selected = false, onPress }: { alert: AlertView; selected?: boolean; onPress: () => void }) {
  const theme = useTheme();
  const c = theme.colors;
  const edge = alert.state === 'raised' ? c.bad : alert.state === 'pending' ? c.caution : c.line;
  return (
    <Pressable
      testID={`alert-row-${alert.id}`}
      accessibilityRole="button"
      accessibilityState={{ selected }}
      accessibilityLabel={`${alert.ruleName}, ${alert.state}`}
      onPress={onPress}
      style={{
        backgroundColor: selected ? c.accentWash : c.surface,
        borderWidth: selected ? theme.borders.strong : theme.borders.hairline,
        borderColor: selected ? c.accent : c.line,
        borderLeftWidth: theme.sizes.accentEdge,
        borderLeftColor: edge,
        borderRadius: theme.radii.md,
        padding: theme.space.lg,
        gap: theme.space.sm,
      }}
    >
      <Text variant="bodyStrong" testID={`alert-note-${alert.id}`} numberOfLines={3}>
        {alert.responderNote}
      </Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.sm }}>
        <AlertStateMark state={alert.state} planned={alert.planned} testID={`alert-state-${alert.id}`} />
        {alert.state === 'no_data' && alert.heldRaised ? (
          <Text variant="small" tone="bad">
            still raised underneath
          </Text>
        ) : null}
        <Text variant="small" tone="muted">
          {alert.severity === 'page' ? 'Page' : 'Ticket'}
        </Text>
      </View>
      <Text variant="small">
        {alert.ruleName}
        <Text variant="small" tone="muted">{` · ${alert.service} · ${groupLabel(alert.labels)}`}</Text>
      </Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', gap: theme.space.md }}>
        <Text variant="numberSmall" tone="muted">
          {alert.value === null ? 'no value' : `value ${formatNumber(alert.value)}`}
        </Text>
        <Text variant="small" tone="muted">
          {alertWhen(alert)}
        </Text>
      </View>
    </Pressable>
  );
}
