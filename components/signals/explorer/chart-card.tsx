import { useMemo, useRef, useState, type ReactNode } from 'react';
import { View } from 'react-native';
import type { QueryResult } from '../../../shared/schemas/signals';
import { formatSlot } from '../../format/time';
import { useTheme } from '../../theme';
import { EmptyState } from '../../ui/empty-state';
import { StatusShape } from '../../ui/status-mark';
import { Text } from '../../ui/text';
import { buildChartModel, nearestRow, type ChartLine, type ChartModel } from '../chart/chart-model';
import { SignalChart } from '../chart/signal-chart';
import type { TimeScale } from '../chart/types';
import { formatAxisValue, formatValue } from '../format-value';

const clock = new Intl.DateTimeFormat(undefined, { hour: '2-digit', minute: '2-digit' });
const dayClock = new Intl.DateTimeFormat(undefined, { weekday: 'short', hour: '2-digit', minute: '2-digit' });

/** One line per group on a shared time axis; pointing at (or tapping) the chart reads the values there. */
export function ChartPanel({ result }: { result: QueryResult }) {
  const theme = useTheme();
  const model = useMemo(() => buildChartModel(result), [result]);
  const [width, setWidth] = useState(0);
  const [selected, setSelected] = useState<number | null>(null);
  const scaleRef = useRef<TimeScale | null>(null);
  const longRange = result.to - result.from > 36 * 3_600_000;
  const formatX = (t: number) => (longRange ? dayClock : clock).format(t);
  const formatY = (v: number) => formatAxisValue(v, result.fn);
  const row = selected !== null ? model.rows[selected] : undefined;

  const pick = (event: PointerLikeEvent) => {
    const scale = scaleRef.current;
    const x = pointerX(event);
    if (!scale || x === null || model.rows.length === 0) return;
    setSelected(nearestRow(model.rows, scale.toT(x)));
  };

  if (model.empty && model.noTraffic.length === 0) {
    return (
      <EmptyState
        testID="signal-chart-empty"
        title="No values in this range"
        body="Nothing matched in the chosen range, or every window held too few samples. Try a longer range or window, or fewer filters."
      />
    );
  }

  return (
    <View style={{ gap: theme.space.md }}>
      <Readout model={model} row={row} result={result} />
      <View onLayout={(e) => setWidth(Math.floor(e.nativeEvent.layout.width))} style={{ height: theme.sizes.chartHeight }} testID="signal-chart">
        {width > 0 ? (
          <SignalChart model={model} width={width} height={theme.sizes.chartHeight} selectedRow={selected} formatX={formatX} formatY={formatY} scaleRef={scaleRef} />
        ) : null}
        <View
          testID="signal-chart-pointer"
          accessibilityLabel="Point at or tap the chart to read the values at that time"
          style={{ position: 'absolute', top: 0, left: 0, right: 0, bottom: 0 }}
          // Pointer events cover mouse, pen and touch alike, without taking the touch from the page's
          // own scrolling (a responder would).
          {...({ onPointerMove: pick, onPointerDown: pick } as object)}
        />
      </View>
      {model.hiddenGroups > 0 ? (
        <Text variant="small" tone="muted">
          {`${model.hiddenGroups} more group${model.hiddenGroups === 1 ? '' : 's'} not drawn (at most ${model.lines.length} lines stay distinguishable); their latest values are in the table. Group by fewer labels or filter to see them.`}
        </Text>
      ) : null}
    </View>
  );
}

type PointerLikeEvent = { nativeEvent: { offsetX?: number; locationX?: number } };

function pointerX(event: PointerLikeEvent): number | null {
  const e = event.nativeEvent as { offsetX?: number; locationX?: number };
  if (typeof e.offsetX === 'number') return e.offsetX;
  if (typeof e.locationX === 'number') return e.locationX;
  return null;
}

/** The legend, with the values at the chosen time beside each line once a time is chosen. */
function Readout({ model, row, result }: { model: ChartModel; row: ChartModel['rows'][number] | undefined; result: QueryResult }) {
  const theme = useTheme();
  return (
    <View testID="signal-readout" style={{ gap: theme.space.sm }}>
      <Text variant="small" tone="muted" testID="signal-readout-time">
        {row ? (
          <Text variant="numberSmall">{formatSlot(new Date(row.t).toISOString())}</Text>
        ) : (
          'Point at the chart, or tap it, to read the values at a time.'
        )}
      </Text>
      <View style={{ flexDirection: 'row', flexWrap: 'wrap', columnGap: theme.space.xl, rowGap: theme.space.xs }}>
        {model.lines.map((line) => (
          <LegendItem key={line.key} line={line}>
            {row ? (
              <Text variant="numberSmall" testID={`signal-readout-value-${line.style}`}>
                {model.noTrafficPoints.has(`${line.key}@${row.t}`) ? 'no traffic' : formatValue(row[line.key], result.fn, result.unit)}
              </Text>
            ) : null}
          </LegendItem>
        ))}
        {model.noTraffic.length ? (
          <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm }}>
            <StatusShape tone="missing" />
            <Text variant="small">No traffic: nothing to divide by, so no ratio</Text>
          </View>
        ) : null}
      </View>
    </View>
  );
}

function LegendItem({ line, children }: { line: ChartLine; children?: ReactNode }) {
  const theme = useTheme();
  const c = theme.colors;
  return (
    <View style={{ flexDirection: 'row', alignItems: 'center', gap: theme.space.sm, flexShrink: 1 }}>
      <View
        style={{
          width: theme.sizes.chartLegendLine,
          borderTopWidth: theme.chart.lineWidth,
          borderStyle: theme.chart.legendStyles[line.style % theme.chart.legendStyles.length],
          borderColor: c.series[line.style % c.series.length],
        }}
      />
      <Text variant="small" style={{ flexShrink: 1 }}>
        {line.label}
      </Text>
      {children}
    </View>
  );
}
