import { View } from 'react-native';
import { useBreakpoints } from '../../../hooks/use-breakpoints';
import type { QueryGroup, QueryPoint, QueryResult } from '../../../shared/schemas/signals';
import { formatTime } from '../../format/time';
import { useTheme } from '../../theme';
import { StatusShape } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { groupLabel, MAX_LINES } from '../chart/chart-model';
import { formatTimeToLimit, formatValue } from '../format-value';

type Latest = { kind: 'value'; point: QueryPoint } | { kind: 'no_traffic'; point: QueryPoint } | { kind: 'none' };

/** The newest instant decides: no traffic now is said as such, not replaced by an older value. */
export function latestOf(group: QueryGroup): Latest {
  for (let i = group.points.length - 1; i >= 0; i--) {
    const p = group.points[i]!;
    if (p.noTraffic) return { kind: 'no_traffic', point: p };
    if (p.v !== null) return { kind: 'value', point: p };
  }
  return { kind: 'none' };
}

/** The latest value of every group (also those past the chart's line limit), figures in mono. */
export function LatestValues({ result }: { result: QueryResult }) {
  const theme = useTheme();
  const c = theme.colors;
  const { atLeastTablet } = useBreakpoints();
  const trend = result.fn === 'trend';
  return (
    <View testID="signal-latest" accessibilityRole="list" style={{ borderTopWidth: theme.borders.hairline, borderTopColor: c.line }}>
      {atLeastTablet ? (
        <View style={{ flexDirection: 'row', gap: theme.space.lg, paddingVertical: theme.space.sm, borderBottomWidth: theme.borders.hairline, borderBottomColor: c.line }}>
          <Header label="Group" flex={3} />
          <Header label="Latest" flex={2} />
          {trend ? <Header label="Reaches the limit" flex={2} /> : null}
          <Header label="At" flex={1} />
        </View>
      ) : null}
      {result.groups.map((group, i) => {
        const latest = latestOf(group);
        const swatch = i < MAX_LINES ? i : null;
        const value =
          latest.kind === 'value' ? (
            <Text variant="number" testID={`signal-latest-value-${i}`}>
              {formatValue(latest.point.v, result.fn, result.unit)}
            </Text>
          ) : latest.kind === 'no_traffic' ? (
            <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
              <StatusShape tone="missing" size={theme.sizes.markSmall} />
              <Text variant="smallStrong" tone="muted" testID={`signal-latest-value-${i}`}>
                no traffic
              </Text>
            </View>
          ) : (
            <Text variant="small" tone="muted" testID={`signal-latest-value-${i}`}>
              no data
            </Text>
          );
        const at = latest.kind === 'none' ? '' : formatTime(new Date(latest.point.t).toISOString());
        const toLimit = trend && latest.kind === 'value' && 'timeToLimitSeconds' in latest.point ? formatTimeToLimit(latest.point.timeToLimitSeconds) : null;
        return (
          <View
            key={i}
            testID={`signal-latest-row-${i}`}
            style={{
              flexDirection: atLeastTablet ? 'row' : 'column',
              alignItems: atLeastTablet ? 'center' : 'stretch',
              gap: atLeastTablet ? theme.space.lg : theme.space.xxs,
              paddingVertical: theme.space.sm,
              borderBottomWidth: theme.borders.hairline,
              borderBottomColor: c.line,
            }}
          >
            <View style={{ flex: atLeastTablet ? 3 : undefined, flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
              {swatch !== null ? (
                <View
                  style={{
                    width: theme.sizes.chartLegendLine,
                    borderTopWidth: theme.chart.lineWidth,
                    borderStyle: theme.chart.legendStyles[swatch % theme.chart.legendStyles.length],
                    borderColor: c.series[swatch % c.series.length],
                  }}
                />
              ) : null}
              <Text variant="small" style={{ flexShrink: 1 }} testID={`signal-latest-label-${i}`}>
                {groupLabel(group.labels)}
              </Text>
            </View>
            <View style={{ flex: atLeastTablet ? 2 : undefined, flexDirection: 'row', alignItems: 'baseline', flexWrap: 'wrap', columnGap: theme.space.md }}>
              {value}
              {!atLeastTablet && at ? (
                <Text variant="numberSmall" tone="muted">
                  {`at ${at}`}
                </Text>
              ) : null}
            </View>
            {toLimit !== null ? (
              <Text variant="numberSmall" tone="muted" style={{ flex: atLeastTablet ? 2 : undefined }}>
                {atLeastTablet ? toLimit : `reaches the limit ${toLimit}`}
              </Text>
            ) : trend && atLeastTablet ? (
              <View style={{ flex: 2 }} />
            ) : null}
            {atLeastTablet ? (
              <Text variant="numberSmall" tone="muted" style={{ flex: 1 }}>
                {at}
              </Text>
            ) : null}
          </View>
        );
      })}
    </View>
  );
}

function Header({ label, flex }: { label: string; flex: number }) {
  return (
    <Text variant="label" tone="muted" style={{ flex }}>
      {label}
    </Text>
  );
}
