import { useMemo } from 'react';
import { Linking, View } from 'react-native';
import { useAlertQuery } from '../../hooks/queries/alerts';
import type { AlertDetail } from '../../shared/rules/api-schemas';
import { describeError } from '../format/describe-error';
import { formatDateTime, formatSlot } from '../format/time';
import { groupLabel } from '../signals/chart/chart-model';
import { formatNumber } from '../signals/format-value';
import { useTheme } from '../theme';
import { Card } from '../ui/card';
import { Loading } from '../ui/loading';
import { Notice } from '../ui/notice';
import { Text } from '../ui/text';
import { AlertStateMark } from './alert-state-mark';
import type { StripRow } from './state-strip';
import { ValueChart } from './value-chart';

/** The inner part of an alert's detail: loads it and draws note, facts, timeline and events. */
export function AlertDetailView({ id }: { id: number }) {
  const detail = useAlertQuery(id);
  if (detail.isPending) return <Loading label="Loading the alert…" />;
  if (detail.isError) return <Notice tone="bad">{describeError(detail.error)}</Notice>;
  return <AlertDetailBody detail={detail.data} />;
}

function Fact({ label, value, mono = false }: { label: string; value: string; mono?: boolean }) {
  const theme = useTheme();
  return (
    <View style={{ flexDirection: 'row', gap: theme.space.md }}>
      <Text variant="small" tone="muted" style={{ width: theme.sizes.figureColumn }}>
        {label}
      </Text>
      <Text variant={mono ? 'numberSmall' : 'small'} style={{ flex: 1 }}>
        {value}
      </Text>
    </View>
  );
}

function AlertDetailBody({ detail }: { detail: AlertDetail }) {
  const theme = useTheme();
  const { alert, series, spans, events } = detail;
  const strip: StripRow[] = useMemo(
    () => [{ label: groupLabel(alert.labels), spans: spans.map((s) => ({ state: s.state, from: Date.parse(s.from), to: s.to ? Date.parse(s.to) : null })) }],
    [alert.labels, spans],
  );
  const chartSeries = useMemo(() => (series ? [{ label: groupLabel(alert.labels), points: series.points }] : []), [series, alert.labels]);
  const period = useMemo<[number, number]>(() => (series ? [series.from, series.to] : [0, 1]), [series]);
  return (
    <View style={{ gap: theme.space.xl }} testID={`alert-detail-${alert.id}`}>
      <Card title="Check first" testID="alert-detail-note">
        <Text variant="body">{alert.responderNote}</Text>
        {alert.runbookUrl ? (
          <Text
            variant="smallStrong"
            tone="accent"
            accessibilityRole="link"
            style={{ textDecorationLine: 'underline' }}
            onPress={() => void Linking.openURL(alert.runbookUrl!)}
            testID="alert-detail-runbook"
          >
            Open the runbook
          </Text>
        ) : null}
      </Card>
      <Card>
        <AlertStateMark state={alert.state} planned={alert.planned} testID="alert-detail-state" />
        <View style={{ gap: theme.space.xs }}>
          <Fact label="Rule" value={alert.ruleName} />
          <Fact label="Condition" value={alert.condition} />
          <Fact label="Service" value={alert.service} />
          <Fact label="Group" value={groupLabel(alert.labels)} />
          <Fact label="Severity" value={alert.severity === 'page' ? 'Page' : 'Ticket'} />
          <Fact label="Value" value={alert.value === null ? '—' : formatNumber(alert.value)} mono />
          <Fact label="Opened" value={formatDateTime(alert.openedAt)} />
          {alert.raisedAt ? <Fact label="Raised" value={formatDateTime(alert.raisedAt)} /> : null}
          {alert.clearedAt ? <Fact label="Cleared" value={formatDateTime(alert.clearedAt)} /> : null}
          {alert.noDataReason ? <Fact label="No data" value={alert.noDataReason.replace(/_/g, ' ')} /> : null}
          {alert.endReason ? <Fact label="Ended" value={alert.endReason} /> : null}
        </View>
        {alert.planned ? <Notice tone="info">Opened during a maintenance window of {alert.service}: recorded, not sent.</Notice> : null}
      </Card>
      <Card title="Timeline" description="The rule's value for this group around the alert; the strip below shows when it was pending and raised.">
        {series ? (
          <ValueChart series={chartSeries} period={period} threshold={null} strip={strip} unit="" testID="alert-timeline" />
        ) : (
          <Notice tone="caution">The signal's values around this alert could not be loaded.</Notice>
        )}
        {detail.warnings.map((w) => (
          <Notice key={w} tone="caution">
            {w}
          </Notice>
        ))}
      </Card>
      <Card title="Events">
        <View style={{ gap: theme.space.sm }} testID="alert-detail-events">
          {events.map((e, i) => (
            <View key={`${e.at}-${i}`} style={{ flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: theme.space.md }}>
              <Text variant="numberSmall" tone="muted">
                {formatSlot(e.at)}
              </Text>
              <AlertStateMark state={e.state} />
              <Text variant="small" tone="muted">
                {e.transition.replace(/_/g, ' ')}
                {e.value === null ? '' : ` at ${formatNumber(e.value)}`}
              </Text>
            </View>
          ))}
        </View>
      </Card>
    </View>
  );
}
