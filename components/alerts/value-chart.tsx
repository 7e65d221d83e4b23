// The rule's value over time (one line per label group, the threshold as a dashed line) with the
// pending / raised spans as a strip under it. Reuses the lazily loaded signal chart.
import { useMemo, useRef, useState } from 'react';
import { View } from 'react-native';
import type { ChartLine, ChartModel, ChartRow } from '../signals/chart/chart-model';
import { SignalChart } from '../signals/chart/signal-chart';
import type { TimeScale } from '../signals/chart/types';
import { formatNumber } from '../signals/format-value';
import { useTheme } from '../theme';
import { EmptyState } from '../ui/empty-state';
import { Text } from '../ui/text';
import { StateStrip, type StripRow } from './state-strip';

export interface ValueSeries {
  label: string;
  points: Array<{ t: number; v: number | null }>;
}

/** Lines that stay distinguishable (colour × dash); more groups are listed, not drawn. */
const MAX_DRAWN = 6;
const THRESHOLD_KEY = 'limit';

const clock = new Intl.DateTimeFormat(undefined, { hour: '2-digit', minute: '2-digit' });
const dayClock = new Intl.DateTimeFormat(undefined, { weekday: 'short', hour: '2-digit', minute: '2-digit' });

export function buildValueModel(series: ValueSeries[], period: [number, number], threshold: number | null): ChartModel {
  const drawn = series.slice(0, MAX_DRAWN);
  // Threshold second, so it gets the dashed pattern and never shares a look with the first group.
  const lines: ChartLine[] = drawn.map((s, i) => ({ key: `g${i}`, label: s.label, style: i === 0 ? 0 : i + 1 }));
  if (threshold !== null) lines.push({ key: THRESHOLD_KEY, label: 'threshold', style: 1 });
  const byTime = new Map<number, ChartRow>();
  let min = Infinity;
  let max = -Infinity;
  let first = Infinity;
  drawn.forEach((s, i) => {
    for (const p of s.points) {
      let row = byTime.get(p.t);
      if (!row) {
        row = { t: p.t };
        for (const l of lines) row[l.key] = l.key === THRESHOLD_KEY ? threshold : null;
        byTime.set(p.t, row);
      }
      row[`g${i}`] = p.v;
      if (p.v !== null && Number.isFinite(p.v)) {
        min = Math.min(min, p.v);
        max = Math.max(max, p.v);
        first = Math.min(first, p.t);
      }
    }
  });
  const empty = min === Infinity;
  if (threshold !== null && !empty) {
    min = Math.min(min, threshold);
    max = Math.max(max, threshold);
  }
  // Start where the values start: a week-long replay of an hour of data is otherwise a sliver.
  const start = empty ? period[0] : Math.max(period[0], first);
  const rows = [...byTime.values()].filter((r) => r.t >= start).sort((a, b) => a.t - b.t);
  const yDomain: [number, number] = empty ? [0, 1] : min >= 0 ? [0, max > 0 ? max * 1.1 : 1] : [min - (max - min || 1) * 0.1, max + (max - min || 1) * 0.1];
  return { rows, lines, hiddenGroups: Math.max(0, series.length - drawn.length), noTraffic: [], noTrafficPoints: new Set(), domain: [start, period[1]], yDomain, connectGaps: false, empty };
}

export function ValueChart({
  series,
  period,
  threshold,
  strip,
  unit,
  testID,
}: {
  series: ValueSeries[];
  period: [number, number];
  threshold: number | null;
  strip: StripRow[];
  unit: string;
  testID: string;
}) {
  const theme = useTheme();
  const model = useMemo(() => buildValueModel(series, period, threshold), [series, period, threshold]);
  const [width, setWidth] = useState(0);
  const scaleRef = useRef<TimeScale | null>(null);
  const longRange = model.domain[1] - model.domain[0] > 36 * 3_600_000;
  const formatX = (t: number) => (longRange ? dayClock : clock).format(t);
  const formatY = (v: number) => formatNumber(v);
  if (model.empty) {
    return <EmptyState testID={`${testID}-empty`} title="No values in this period" body="The rule found no data to evaluate here: check the service, signal and label filters." />;
  }
  const trimmed = model.domain[0] > period[0];
  return (
    <View style={{ gap: theme.space.sm }} testID={testID}>
      <View onLayout={(e) => setWidth(Math.floor(e.nativeEvent.layout.width))} style={{ height: theme.sizes.chartHeight }}>
        {width > 0 ? (
          <SignalChart model={model} width={width} height={theme.sizes.chartHeight} selectedRow={null} formatX={formatX} formatY={formatY} scaleRef={scaleRef} />
        ) : null}
      </View>
      {width > 0 ? <StateStrip rows={strip} domain={model.domain} width={width} scaleRef={scaleRef} testID={`${testID}-strip`} /> : null}
      <Legend lines={model.lines} unit={unit} />
      {trimmed ? (
        <Text variant="caption" tone="faint">
          {`No values before ${dayClock.format(model.domain[0])}; the chart starts there.`}
        </Text>
      ) : null}
      {model.hiddenGroups > 0 ? (
        <Text variant="caption" tone="muted">{`${model.hiddenGroups} more group${model.hiddenGroups === 1 ? '' : 's'} not drawn.`}</Text>
      ) : null}
    </View>
  );
}

function Legend({ lines, unit }: { lines: ChartLine[]; unit: string }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.lg, rowGap: theme.space.xs }}>
      {lines.map((l) => (
        <View key={l.key} style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm, flexShrink: 1 }}>
          <View
            style={{
              width: theme.sizes.chartLegendLine,
              borderTopWidth: theme.chart.lineWidth,
              borderStyle: theme.chart.legendStyles[l.style % theme.chart.legendStyles.length],
              borderColor: c.series[l.style % c.series.length],
            }}
          />
          <Text variant="caption" tone="muted" numberOfLines={1} style={{ flexShrink: 1 }}>
            {l.label}
            {l.key !== THRESHOLD_KEY && unit ? ` (${unit})` : ''}
          </Text>
        </View>
      ))}
    </View>
  );
}
